import { describe, expect, it } from 'vitest';
import { renderToStaticMarkup } from 'react-dom/server';
import { MemoryRouter } from 'react-router-dom';
import { StartingUp } from './RootLayout';
import { startingShellHtml } from './starting-shell';

describe('the page’s starting frame (index.html) is what React first renders', () => {
  it('is the same markup as StartingUp, so nothing moves or changes words when React takes over', () => {
    const rendered = renderToStaticMarkup(
      <MemoryRouter>
        <StartingUp />
      </MemoryRouter>,
    );
    expect(startingShellHtml()).toBe(rendered);
  });
});
