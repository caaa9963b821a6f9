import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import { StatusMark } from './StatusMark';
import { LineBar } from './LineBar';

describe('StatusMark', () => {
  it.each([
    ['out', 'Out'],
    ['limited', 'Limited'],
    ['full', 'Full'],
  ] as const)('names %s in words for assistive technology', (status, word) => {
    render(<StatusMark status={status} />);
    expect(screen.getByRole('img', { name: `Participation status: ${word}` })).toBeInTheDocument();
    expect(screen.getByText(word)).toBeInTheDocument();
  });

  it('draws a distinct shape per status, so it reads without colour', () => {
    const { container } = render(
      <>
        <StatusMark status="out" />
        <StatusMark status="limited" />
        <StatusMark status="full" />
      </>,
    );
    const shapes = [...container.querySelectorAll('svg')];
    expect(shapes.map((svg) => svg.getAttribute('data-shape'))).toEqual(['out', 'limited', 'full']);
    // Open square: outline only. Half: outline plus a half-height fill. Full: outline plus a full fill.
    expect(shapes.map((svg) => svg.querySelectorAll('rect').length)).toEqual([1, 2, 2]);
    expect(shapes[1].querySelectorAll('rect')[1].getAttribute('height')).toBe('6.5');
    expect(shapes[2].querySelectorAll('rect')[1].getAttribute('height')).toBe('13');
  });

  it('can explain the status in plain words', () => {
    render(<StatusMark status="limited" explain />);
    expect(screen.getByRole('img', { name: /Limited — training within the limits/ })).toBeInTheDocument();
  });
});

describe('LineBar', () => {
  it('shows the value under the line without alarm', () => {
    render(<LineBar label="Planned load" value={50} limit={60} unit="kg" />);
    const meter = screen.getByRole('meter', { name: 'Planned load' });
    expect(meter).toHaveAttribute('aria-valuenow', '50');
    expect(meter).toHaveAttribute('aria-valuetext', '50 kg, limit 60 kg');
    expect(screen.getByText('Limit 60 kg')).toBeInTheDocument();
    expect(meter.querySelector('[data-part="over"]')).toBeNull();
  });

  it('shows a breach as the bar crossing the line plus words', () => {
    render(<LineBar label="Planned load" value={72.5} limit={60} unit="kg" />);
    const meter = screen.getByRole('meter', { name: 'Planned load' });
    expect(meter.querySelector('[data-part="over"]')).not.toBeNull();
    expect(meter).toHaveAttribute('aria-valuetext', '72.5 kg, over the line by 12.5 kg (limit 60 kg)');
    expect(screen.getByText('Over the line by 12.5 kg — the limit is 60 kg')).toBeInTheDocument();
  });

  it('treats a value exactly on the line as within it', () => {
    render(<LineBar label="Hard sets this week" value={12} limit={12} />);
    expect(screen.getByRole('meter')).toHaveAttribute('aria-valuetext', '12, limit 12');
  });
});
