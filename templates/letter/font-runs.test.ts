import { describe, expect, it } from 'vitest';
import { fontRuns, subsetOf } from './font-runs';

// The ranges come from @fontsource/public-sans/unicode.json (the package's own subset table).
describe('cutting text into runs by Public Sans subset', () => {
  it('keeps plain Latin in one run', () => {
    expect(fontRuns('Maya Torres')).toEqual([{ subset: 'latin', text: 'Maya Torres' }]);
  });

  it('sends Ł, Ż, ó-with-acute composed forms to the right files', () => {
    expect(subsetOf('Ł'.codePointAt(0)!)).toBe('latin-ext');
    expect(subsetOf('ó'.codePointAt(0)!)).toBe('latin');
    expect(fontRuns('Łucja Żółć')).toEqual([
      { subset: 'latin-ext', text: 'Ł' },
      { subset: 'latin', text: 'ucja ' },
      { subset: 'latin-ext', text: 'Ż' },
      { subset: 'latin', text: 'ó' },
      { subset: 'latin-ext', text: 'łć' },
    ]);
  });

  it('composes decomposed input first, so a Vietnamese letter is one glyph from one file', () => {
    const decomposed = 'Nguye\u0302\u0303n';
    expect(fontRuns(decomposed).map((r) => r.subset)).toEqual(['latin', 'vietnamese', 'latin']);
    expect(
      fontRuns(decomposed)
        .map((r) => r.text)
        .join(''),
    ).toBe('Nguyễn');
  });
});
