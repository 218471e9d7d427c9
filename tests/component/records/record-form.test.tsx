import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import type { Coating } from '@/lib/contracts/coatings';
import { CoatingForm } from '@/components/records/coatings';
import { errorBody, renderFresh, stubFetch } from '../support';

const refresh = vi.fn();
vi.mock('next/navigation', () => ({ useRouter: () => ({ refresh, push: vi.fn() }) }));

const coating: Coating = {
  id: 'coating-ht200',
  organizationId: 'org-kestrel',
  code: 'HT-200',
  name: 'Hydrophobic topcoat',
  description: 'Fluorine-free topcoat for outdoor aluminium panels.',
  version: 3,
  archivedAt: null,
  createdAt: new Date('2026-03-02T09:00:00Z'),
  updatedAt: new Date('2026-03-02T09:00:00Z'),
  createdByUserId: 'user-admin',
};

describe('record form', () => {
  it('checks the form with the shared schema before sending anything', async () => {
    const calls = stubFetch(() => ({ status: 201, body: {} }));
    renderFresh(<CoatingForm />);
    const form = screen.getByRole('form', { name: 'New coating' });
    await userEvent.click(within(form).getByRole('button', { name: 'Add coating' }));
    expect(await within(form).findByText('Enter a coating code, like HT-200.')).toBeTruthy();
    expect(calls).toHaveLength(0);
  });

  it('shows the record as someone else saved it, keeps the edit and applies it over their version', async () => {
    let attempt = 0;
    const calls = stubFetch(() =>
      ++attempt === 1
        ? {
            status: 409,
            body: errorBody('stale_version', 'Someone changed this coating.', undefined, {
              current: { ...coating, name: 'Topcoat, second formula', version: 4 },
            }),
          }
        : { body: { coating: { ...coating, name: 'Outdoor topcoat', version: 5 } } },
    );
    renderFresh(<CoatingForm coating={coating} />);
    const form = screen.getByRole('form', { name: 'Edit coating' });
    const name = within(form).getByLabelText('Name');
    await userEvent.clear(name);
    await userEvent.type(name, 'Outdoor topcoat');
    await userEvent.click(within(form).getByRole('button', { name: 'Save coating' }));

    const current = await within(form).findByTestId('conflict-current');
    expect(within(current).getByText('Topcoat, second formula')).toBeTruthy();
    expect((name as HTMLInputElement).value).toBe('Outdoor topcoat');
    await userEvent.click(within(form).getByRole('button', { name: /Apply my changes/ }));
    await userEvent.click(within(form).getByRole('button', { name: 'Save coating' }));

    await waitFor(() => expect(within(form).getByRole('status').textContent).toBe('Saved.'));
    expect(calls.map((c) => (c.body as { version: number }).version)).toEqual([3, 4]);
    expect(calls[1]).toMatchObject({ url: '/api/coatings/coating-ht200', method: 'PATCH' });
    expect(within(form).queryByTestId('conflict-current')).toBeNull();
    expect(refresh).toHaveBeenCalledTimes(1);
  });
});
