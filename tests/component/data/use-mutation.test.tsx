import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useForm } from 'react-hook-form';
import { describe, expect, it } from 'vitest';
import { useMutation } from '@/components/data/use-mutation';
import { TextField, fieldsOf } from '@/components/ui/fields';
import { errorBody, stubFetch } from '../support';

type Values = { code: string; version: number };

/** A record form the way the app builds one: react-hook-form, the mutation hook, a field. */
function CoatingCodeForm() {
  const form = useForm<Values>({ defaultValues: { code: 'HT-200', version: 3 } });
  const save = useMutation<{ coating: Values }, Values>({ form, fields: ['code'] });
  const field = fieldsOf(form, 'coating');
  return (
    <form
      noValidate
      onSubmit={form.handleSubmit(async (values) => {
        await save.run('/api/coatings/c1', { method: 'PATCH', json: values });
      })}
    >
      <TextField label="Code" {...field('code')} />
      <button type="submit" disabled={save.pending}>
        {save.pending ? 'Saving…' : 'Save'}
      </button>
      {save.message ? <p data-testid="message">{save.message}</p> : null}
      {save.conflict ? (
        <button type="button" onClick={save.resolveConflict}>
          Apply my changes
        </button>
      ) : null}
    </form>
  );
}

describe('useMutation', () => {
  it("puts the server's field errors on the form's fields, wired for screen readers", async () => {
    stubFetch(() => ({
      status: 400,
      body: errorBody('invalid_input', 'Some fields are not valid.', {
        code: 'Enter a coating code, like HT-200.',
      }),
    }));
    render(<CoatingCodeForm />);
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    const input = await screen.findByRole('textbox', { name: 'Code' });
    await waitFor(() => expect(input.getAttribute('aria-invalid')).toBe('true'));
    const described = document.getElementById(input.getAttribute('aria-describedby') ?? '');
    expect(described?.textContent).toBe('Enter a coating code, like HT-200.');
    // Every problem is on its field: no summary line repeats it.
    expect(screen.queryByTestId('message')).toBeNull();
  });

  it('shows the message when the server names a field this form does not have', async () => {
    stubFetch(() => ({
      status: 400,
      body: errorBody('invalid_input', 'Some fields are not valid.', { owner: 'Unknown owner.' }),
    }));
    render(<CoatingCodeForm />);
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect((await screen.findByTestId('message')).textContent).toBe('Some fields are not valid.');
  });

  it('turns a 409 stale_version into a conflict, and the next save carries the current version', async () => {
    let saves = 0;
    const calls = stubFetch(() =>
      ++saves === 1
        ? {
            status: 409,
            body: errorBody('stale_version', 'Changed meanwhile.', undefined, {
              current: { code: 'HT-201', version: 5 },
            }),
          }
        : { body: { coating: { code: 'HT-200', version: 6 } } },
    );
    render(<CoatingCodeForm />);
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    await userEvent.click(await screen.findByRole('button', { name: 'Apply my changes' }));
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    await waitFor(() => expect(calls).toHaveLength(2));
    expect(calls[0].body).toEqual({ code: 'HT-200', version: 3 });
    expect(calls[1].body).toEqual({ code: 'HT-200', version: 5 });
    expect(screen.queryByRole('button', { name: 'Apply my changes' })).toBeNull();
  });

  it('says a network failure lost nothing, keeps what was typed and is pending meanwhile', async () => {
    let goOffline: () => void = () => {};
    stubFetch(
      () =>
        new Promise((_resolve, reject) => {
          goOffline = () => reject(new TypeError('Failed to fetch'));
        }),
    );
    render(<CoatingCodeForm />);
    const input = screen.getByRole('textbox', { name: 'Code' });
    await userEvent.clear(input);
    await userEvent.type(input, 'HT-300');
    await userEvent.click(screen.getByRole('button', { name: 'Save' }));
    expect((await screen.findByRole('button', { name: 'Saving…' })).hasAttribute('disabled')).toBe(
      true,
    );
    goOffline();
    expect((await screen.findByTestId('message')).textContent).toMatch(/nothing was lost/);
    expect((input as HTMLInputElement).value).toBe('HT-300');
    expect(screen.getByRole('button', { name: 'Save' }).hasAttribute('disabled')).toBe(false);
  });
});
