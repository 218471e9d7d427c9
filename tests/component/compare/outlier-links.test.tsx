import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ComparisonView } from '@/components/compare/comparison-view';
import { buildComparison, type ComparisonDropInput } from '@/lib/compare';

const drop = (n: number, meanDeg: number): ComparisonDropInput => ({
  dropId: `drop-${n}`,
  batchId: 'batch-a',
  sampleId: 'sample-a',
  sampleLabel: `D${n}`,
  probeLiquidId: 'liquid-water',
  measuredAt: '2026-12-01T09:00:00.000Z',
  treatedAt: null,
  leftDeg: meanDeg,
  rightDeg: meanDeg,
  meanDeg,
});

describe('compare page outliers', () => {
  it('links each outlier drop to its drop page', () => {
    // 130° lies far outside Tukey's fences of the other five.
    const angles = [100, 101, 102, 101, 100, 130];
    const comparison = buildComparison({
      batches: [{ id: 'batch-a', lotCode: 'B-A', producedOn: '2026-11-30' }],
      liquids: [{ id: 'liquid-water', name: 'Water' }],
      specs: [],
      drops: angles.map((a, i) => drop(i + 1, a)),
    });
    render(<ComparisonView comparison={comparison} />);
    const row = screen.getByTestId('batch-row-liquid-water-B-A');
    const links = within(row)
      .getAllByRole('link')
      .filter((a) => a.getAttribute('href')?.startsWith('/drops/'));
    expect(links.map((a) => [a.textContent, a.getAttribute('href')])).toEqual([
      ['D6 130.0°', '/drops/drop-6'],
    ]);
  });
});
