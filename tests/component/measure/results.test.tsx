import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { photoBadge } from '@/components/measure/photo-table';
import { ResultsPanel } from '@/components/measure/results-panel';
import type { WorkspacePhoto } from '@/components/measure/store';
import { DEFAULT_SETTINGS } from '@/lib/analysis/settings';
import type { AnalysisResult } from '@/lib/analysis/types';

/** A drop analysed with a circle fit; the figures only need to be recognisable on screen. */
const result = (overrides: Partial<AnalysisResult> = {}): AnalysisResult => ({
  method: 'circle',
  leftDeg: 104.26,
  rightDeg: 101.04,
  meanDeg: 102.65,
  leftUncertaintyDeg: 0.8,
  rightUncertaintyDeg: 1.2,
  uncertaintyParts: {
    baselineShiftDeg: { left: 0.5, right: 0.9 },
    fitStandardErrorDeg: { left: 0.6, right: 0.7 },
  },
  baseline: { x1: 10, y1: 200, x2: 300, y2: 200 },
  baselineSource: 'automatic',
  contactLeft: [60, 200],
  contactRight: [250, 200],
  baseDiameterPx: 190,
  heightPx: 120.4,
  apexRadiusPx: null,
  bond: null,
  volumePx3: 2_400_000,
  surfaceAreaPx2: null,
  volumeUl: null,
  surfaceAreaMm2: null,
  rmsResidualPx: 0.42,
  edgePointCount: 311,
  edgePoints: { left: [], right: [] },
  profile: null,
  warnings: [],
  modelCheck: { estimatedBond: null, youngLaplaceDeg: null, modelBiasDeg: null },
  provisional: false,
  settings: DEFAULT_SETTINGS,
  timeMs: 40,
  ...overrides,
});

describe('measure results panel', () => {
  it('shows the angles with their uncertainty and the drop size', () => {
    render(<ResultsPanel result={result()} status="ready" error={null} />);
    expect(screen.getByTestId('angle-left').textContent).toBe('104.3°');
    expect(screen.getByTestId('angle-right').textContent).toBe('101.0°');
    expect(screen.getByTestId('angle-mean').textContent).toBe('102.7°');
    // The mean's uncertainty is the average of the two sides'.
    const mean = screen.getByTestId('angle-mean').parentElement!;
    expect(within(mean).getByText('± 1.0°')).toBeTruthy();
    expect(screen.getByText('2.40 ×10⁶ px³')).toBeTruthy();
    expect(screen.getByText('found automatically')).toBeTruthy();
    expect(screen.getByText('No quality warnings.')).toBeTruthy();
  });

  it('lists the quality warnings in words', () => {
    render(
      <ResultsPanel
        result={result({
          warnings: [
            { code: 'left_right_disagree', message: 'Left and right differ by 3.2°.' },
            { code: 'needle_in_contact', message: 'The needle still touches the drop.' },
          ],
        })}
        status="ready"
        error={null}
      />,
    );
    const list = screen.getByRole('list', { name: 'Warnings' });
    const items = within(list).getAllByRole('listitem');
    expect(items.map((item) => item.textContent)).toEqual([
      'Left and right differ by 3.2°.',
      'The needle still touches the drop.',
    ]);
    expect(items[1].getAttribute('data-code')).toBe('needle_in_contact');
    expect(screen.queryByText('No quality warnings.')).toBeNull();
  });

  it('says that no photo is shown rather than "Analysing…" when the table is empty', () => {
    render(<ResultsPanel result={null} status={null} error={null} />);
    expect(screen.getByRole('region', { name: 'Result' }).textContent).toMatch(/No photo shown/);
    expect(screen.queryByText('Analysing…')).toBeNull();
  });

  it('says why there is no result', () => {
    render(<ResultsPanel result={null} status="failed" error="No drop was found in the photo." />);
    expect(screen.getByRole('alert').textContent).toBe('No drop was found in the photo.');
  });
});

describe('photo badge', () => {
  const photo = (overrides: Partial<WorkspacePhoto>): WorkspacePhoto => ({
    id: 'p1',
    name: 'drop.png',
    width: 640,
    height: 480,
    status: 'ready',
    error: null,
    result: result(),
    method: 'young-laplace',
    baseline: null,
    sampleId: '',
    probeLiquidId: '',
    dropId: null,
    savedRevision: null,
    dirty: true,
    ...overrides,
  });

  it('tells analysing, failed, needing a look, analysed and saved apart', () => {
    expect(photoBadge(photo({ status: 'analysing', result: null })).label).toBe('Analysing');
    expect(photoBadge(photo({ status: 'failed', result: null })).label).toBe('No result');
    expect(
      photoBadge(
        photo({ result: result({ warnings: [{ code: 'low_contrast', message: 'Low.' }] }) }),
      ).label,
    ).toBe('Check');
    expect(photoBadge(photo({})).label).toBe('Analysed');
    expect(photoBadge(photo({ savedRevision: 2, dirty: false })).label).toBe('Saved r2');
    // Changed since it was saved: the saved revision no longer describes what is shown.
    expect(photoBadge(photo({ savedRevision: 2, dirty: true })).label).toBe('Changed since r2');
  });
});
