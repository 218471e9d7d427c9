import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import type { PhotoDrop } from '@/components/data/resources';
import { RevisionsPanel } from '@/components/measure/revisions-panel';
import { SelectionBar } from '@/components/measure/selection-bar';
import type { WorkspacePhoto } from '@/components/measure/store';

const photo = (id: string, name: string, savedRevision: number | null): WorkspacePhoto => ({
  id,
  name,
  width: 640,
  height: 480,
  status: 'ready',
  error: null,
  result: null,
  method: 'circle',
  baseline: null,
  sampleId: 'sample-1',
  probeLiquidId: 'liquid-water',
  dropId: savedRevision === null ? null : `drop-${id}`,
  savedRevision,
  dirty: savedRevision === null,
});

// a.png and c.png are ticked; b.png is not; c.png is saved already.
const A = photo('p-a', 'a.png', null);
const B = photo('p-b', 'b.png', null);
const C = photo('p-c', 'c.png', 1);

function renderBar() {
  const onRemove = vi.fn<(photos: WorkspacePhoto[]) => void>();
  render(
    <SelectionBar
      photos={[A, B, C]}
      ticked={[A, C]}
      samples={[]}
      liquids={[]}
      saving={false}
      onAssign={() => undefined}
      onSave={() => undefined}
      onRemove={onRemove}
    />,
  );
  return onRemove;
}

const listed = (heading: string) =>
  within(screen.getByRole('heading', { name: heading }).parentElement!)
    .getAllByRole('listitem')
    .map((li) => li.textContent);

describe('removing photos from the workspace (selection bar)', () => {
  it('"Remove ticked" asks first, then removes the ticked unsaved photos and keeps a saved one', async () => {
    const onRemove = renderBar();
    await userEvent.click(screen.getByRole('button', { name: 'Remove ticked' }));
    expect(onRemove).not.toHaveBeenCalled();
    expect(listed('Remove 1 ticked photo(s)?')).toEqual(['a.png']);
    await userEvent.click(screen.getByRole('button', { name: 'Remove' }));
    expect(onRemove).toHaveBeenCalledTimes(1);
    expect(onRemove.mock.calls[0][0].map((p) => p.name)).toEqual(['a.png']);
  });

  it('"Remove all unsaved" removes every unsaved photo, ticked or not, and no saved one', async () => {
    const onRemove = renderBar();
    await userEvent.click(screen.getByRole('button', { name: 'Remove all unsaved' }));
    expect(listed('Remove 2 unsaved photo(s)?')).toEqual(['a.png', 'b.png']);
    await userEvent.click(screen.getByRole('button', { name: 'Remove' }));
    expect(onRemove.mock.calls[0][0].map((p) => p.name)).toEqual(['a.png', 'b.png']);
  });

  it('removes nothing when the question is cancelled', async () => {
    const onRemove = renderBar();
    await userEvent.click(screen.getByRole('button', { name: 'Remove all unsaved' }));
    await userEvent.click(screen.getByRole('button', { name: 'Cancel' }));
    expect(onRemove).not.toHaveBeenCalled();
    expect(screen.queryByRole('heading', { name: /Remove \d/ })).toBeNull();
  });

  it('cannot remove ticked photos that are all saved', () => {
    render(
      <SelectionBar
        photos={[C]}
        ticked={[C]}
        samples={[]}
        liquids={[]}
        saving={false}
        onAssign={() => undefined}
        onSave={() => undefined}
        onRemove={() => undefined}
      />,
    );
    expect(screen.getByRole('button', { name: 'Remove ticked' })).toHaveProperty('disabled', true);
    expect(screen.getByRole('button', { name: 'Remove all unsaved' })).toHaveProperty(
      'disabled',
      true,
    );
  });
});

describe('saved revisions panel', () => {
  it('names each revision’s method in words, not by its stored code', () => {
    const revision = (n: number, method: 'young-laplace' | 'height-width', hand: boolean) => ({
      id: `a${n}`,
      revision: n,
      method,
      baseline: hand ? { x1: 0, y1: 330, x2: 639, y2: 331 } : null,
      leftDeg: 60.04,
      rightDeg: 59.96,
      meanDeg: 60,
      leftUncertaintyDeg: null,
      rightUncertaintyDeg: null,
      softwareVersion: '1.0.0',
      reviewStatus: 'draft' as const,
      createdAt: '2026-12-02T09:00:00.000Z',
      createdByUserId: 'user-analyst',
      result: {} as PhotoDrop['revisions'][number]['result'],
    });
    const drop: PhotoDrop = {
      id: 'drop-1',
      sampleId: 'sample-1',
      probeLiquidId: 'liquid-water',
      sessionId: null,
      sampleLabel: 'P1',
      lotCode: 'B-0412',
      coatingCode: 'HT-200',
      revisions: [revision(2, 'height-width', true), revision(1, 'young-laplace', false)],
    };
    render(<RevisionsPanel drop={drop} error={null} />);
    const methods = screen
      .getAllByRole('row')
      .slice(1)
      .map((row) => within(row).getAllByRole('cell')[1].textContent);
    expect(methods).toEqual(['Height–width · hand baseline', 'Young–Laplace']);
    expect(screen.getByTestId('revisions').textContent).not.toMatch(/young-laplace|height-width/);
  });
});
