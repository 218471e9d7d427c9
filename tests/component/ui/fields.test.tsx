import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it } from 'vitest';
import {
  CheckboxField,
  NumberField,
  SelectField,
  TextAreaField,
  TextField,
} from '@/components/ui/fields';

const describedText = (element: HTMLElement) =>
  (element.getAttribute('aria-describedby') ?? '')
    .split(' ')
    .filter(Boolean)
    .map((id) => document.getElementById(id)?.textContent);

describe('form fields', () => {
  it('describe the control by its hint while it is valid', () => {
    render(<TextField label="Lot code" hint="Like B-0412" name="lotCode" />);
    const input = screen.getByRole('textbox', { name: 'Lot code' });
    expect(describedText(input)).toEqual(['Like B-0412']);
    expect(input.hasAttribute('aria-invalid')).toBe(false);
  });

  it('replace the hint by the error and mark the control invalid', () => {
    render(
      <TextField label="Lot code" hint="Like B-0412" error="Enter the lot code." name="lotCode" />,
    );
    const input = screen.getByRole('textbox', { name: 'Lot code' });
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(describedText(input)).toEqual(['Enter the lot code.']);
    expect(screen.queryByText('Like B-0412')).toBeNull();
    expect(screen.getByRole('alert').textContent).toBe('Enter the lot code.');
  });

  it('give each field its own id when none is given', () => {
    render(
      <>
        <TextField label="First" hint="One" />
        <TextField label="Second" hint="Two" />
      </>,
    );
    const first = screen.getByRole('textbox', { name: 'First' });
    const second = screen.getByRole('textbox', { name: 'Second' });
    expect(first.id).not.toBe(second.id);
    expect(describedText(first)).toEqual(['One']);
    expect(describedText(second)).toEqual(['Two']);
  });

  it('label a number with its unit and keep what was typed, even when it is not a number', async () => {
    render(<NumberField label="Force" unit="mN" name="force" />);
    const input = screen.getByLabelText('Force (mN)') as HTMLInputElement;
    expect(input.inputMode).toBe('decimal');
    await userEvent.type(input, 'abc');
    expect(input.value).toBe('abc');
  });

  it('offer a placeholder choice first in a select and wire its error', () => {
    render(
      <SelectField
        label="Probe liquid"
        placeholder="Choose a liquid"
        options={[{ value: 'liquid-water', label: 'Water' }]}
        error="Choose the probe liquid."
        defaultValue=""
      />,
    );
    const select = screen.getByRole('combobox', { name: 'Probe liquid' }) as HTMLSelectElement;
    expect([...select.options].map((o) => o.text)).toEqual(['Choose a liquid', 'Water']);
    expect(select.getAttribute('aria-invalid')).toBe('true');
    expect(describedText(select)).toEqual(['Choose the probe liquid.']);
  });

  it('wire a text area and a checkbox the same way', async () => {
    render(
      <>
        <TextAreaField label="Notes" error="Use at most 2000 characters." />
        <CheckboxField label="Show archived" hint="Archived records are kept, not changed." />
      </>,
    );
    const notes = screen.getByRole('textbox', { name: 'Notes' });
    expect(describedText(notes)).toEqual(['Use at most 2000 characters.']);
    const box = screen.getByRole('checkbox', { name: 'Show archived' }) as HTMLInputElement;
    expect(describedText(box)).toEqual(['Archived records are kept, not changed.']);
    await userEvent.click(screen.getByText('Show archived'));
    expect(box.checked).toBe(true);
  });
});
