import { screen, waitFor } from '@testing-library/react';
import { describe, expect, it, vi } from 'vitest';
import { usePhotoDrop } from '@/components/data/resources';
import { renderFresh, stubFetch } from '../support';

function PhotoDropLabel({ photoId }: { photoId: string }) {
  const { drop } = usePhotoDrop(photoId);
  return <p data-testid="drop">{drop ? `${drop.coatingCode} · ${drop.lotCode}` : 'unsaved'}</p>;
}

const revision = {
  id: 'analysis-1',
  revision: 1,
  method: 'circle',
  baseline: { x1: 10, y1: 400, x2: 900, y2: 402 },
  leftDeg: 104.2,
  rightDeg: 105.1,
  meanDeg: 104.65,
  leftUncertaintyDeg: 0.4,
  rightUncertaintyDeg: 0.5,
  softwareVersion: '0.1.0',
  reviewStatus: 'draft',
  createdAt: '2026-03-14T09:30:00.000Z',
  createdByUserId: 'user-analyst',
  result: {},
};

const drop = {
  id: 'drop-1',
  sampleId: 'sample-1',
  probeLiquidId: 'liquid-water',
  sessionId: null,
  sampleLabel: 'Panel A',
  lotCode: 'L-0412',
  coatingCode: 'HT-200',
  revisions: [revision],
};

describe('resource hooks', () => {
  it('check a reply against its lib/contracts schema in development and say which field is off', async () => {
    const report = vi.spyOn(console, 'error').mockImplementation(() => {});
    stubFetch(() => ({
      body: { drop: { ...drop, revisions: [{ ...revision, meanDeg: 'wide' }] } },
    }));
    renderFresh(<PhotoDropLabel photoId="p1" />);
    await waitFor(() => expect(report).toHaveBeenCalledTimes(1));
    expect(String(report.mock.calls[0][0])).toMatch(
      /GET \/api\/photos\/p1\/drop .*drop\.revisions\.0\.meanDeg/,
    );
  });

  it('take a reply that matches its contract without a report', async () => {
    const report = vi.spyOn(console, 'error').mockImplementation(() => {});
    stubFetch(() => ({ body: { drop } }));
    renderFresh(<PhotoDropLabel photoId="p1" />);
    expect(await screen.findByText('HT-200 · L-0412')).toBeTruthy();
    expect(report).not.toHaveBeenCalled();
  });
});
