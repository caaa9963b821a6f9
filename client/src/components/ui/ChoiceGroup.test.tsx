import { useState } from 'react';
import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { CheckboxGroup, ChoiceGroup, RadioGroup } from './Field';

const ROLES = [
  { value: 'coach', label: 'Coach' },
  { value: 'clinician', label: 'Clinician', hint: 'Sees clinical notes' },
  { value: 'admin', label: 'Admin' },
] as const;
type Role = (typeof ROLES)[number]['value'];

function Roles({ initial = [], error }: { initial?: Role[]; error?: string }) {
  const [value, setValue] = useState<Role[]>(initial);
  return <CheckboxGroup legend="Roles" name="roles" options={ROLES} value={value} onChange={setValue} error={error} hint="Pick any." />;
}

function Unit({ error, onChange = () => {} }: { error?: string; onChange?: (u: 'kg' | 'lb') => void }) {
  const [value, setValue] = useState<'kg' | 'lb' | undefined>(undefined);
  return (
    <RadioGroup
      legend="Unit"
      name="unit"
      options={[
        { value: 'kg', label: 'kg' },
        { value: 'lb', label: 'lb' },
      ]}
      value={value}
      onChange={(next) => {
        setValue(next);
        onChange(next);
      }}
      error={error}
    />
  );
}

describe('ChoiceGroup', () => {
  it('draws tick boxes that keep the options’ order, whatever order they are ticked in', () => {
    const onChange = vi.fn();
    render(<ChoiceGroup multiple legend="Roles" name="roles" options={ROLES} value={['admin']} onChange={onChange} />);
    fireEvent.click(screen.getByRole('checkbox', { name: 'Coach' }));
    expect(onChange).toHaveBeenCalledWith(['coach', 'admin']);
  });

  it('ticks and unticks in a controlled group', () => {
    render(<Roles initial={['coach']} />);
    const coach = screen.getByRole('checkbox', { name: 'Coach' });
    expect(coach).toBeChecked();
    fireEvent.click(coach);
    expect(coach).not.toBeChecked();
    fireEvent.click(screen.getByRole('checkbox', { name: /Clinician/ }));
    expect(screen.getByRole('checkbox', { name: /Clinician/ })).toBeChecked();
  });

  it('draws radio buttons of which one is chosen', () => {
    const onChange = vi.fn();
    render(<Unit onChange={onChange} />);
    fireEvent.click(screen.getByRole('radio', { name: 'lb' }));
    expect(onChange).toHaveBeenCalledWith('lb');
    expect(screen.getByRole('radio', { name: 'lb' })).toBeChecked();
    expect(screen.getByRole('radio', { name: 'kg' })).not.toBeChecked();
  });

  it('names the group by its legend and describes it by its hint', () => {
    render(<Roles />);
    const group = screen.getByRole('group', { name: 'Roles' });
    expect(group).toHaveAccessibleDescription('Pick any.');
  });

  it.each([
    ['tick boxes', () => render(<Roles error="choose at least one" />), 'checkbox', 'Roles choose at least one'],
    ['radio buttons', () => render(<Unit error="is required" />), 'radio', 'Unit is required'],
  ] as const)('marks every one of its %s invalid and describes each by the error', (_kind, draw, role, sentence) => {
    draw();
    const inputs = screen.getAllByRole(role);
    expect(inputs.length).toBeGreaterThan(1);
    for (const input of inputs) {
      expect(input).toHaveAttribute('aria-invalid', 'true');
      expect(input).toHaveAccessibleDescription(sentence);
    }
    expect(screen.getByText(sentence)).toBeInTheDocument();
  });

  it('says nothing is wrong while there is no error', () => {
    render(
      <>
        <Roles />
        <Unit />
      </>,
    );
    for (const input of [...screen.getAllByRole('checkbox'), ...screen.getAllByRole('radio')]) {
      expect(input).not.toHaveAttribute('aria-invalid');
      expect(input).not.toHaveAttribute('aria-describedby');
    }
  });
});
