import { render, screen, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { DropRevisions, type DropRevisionRow } from '@/components/drops/drop-revisions';

const row = (overrides: Partial<DropRevisionRow>): DropRevisionRow => ({
  id: 'a1',
  revision: 1,
  createdAt: new Date('2026-12-01T09:30:00Z'),
  createdBy: 'Ana Analyst',
  method: 'young-laplace',
  baselineSource: 'automatic',
  reason: null,
  leftDeg: 101.24,
  rightDeg: 100.96,
  meanDeg: 101.1,
  operatorName: 'Ana Analyst',
  temperatureC: 21.5,
  humidityPct: 41,
  dropVolumeUl: null,
  scalePxPerMm: null,
  ...overrides,
});

describe('a drop page’s revisions', () => {
  it('shows when, who, the method in words and where the baseline came from', () => {
    render(
      <DropRevisions
        revisions={[
          row({
            id: 'a2',
            revision: 2,
            createdAt: new Date('2026-12-02T14:05:00Z'),
            createdBy: 'Rita Reviewer',
            method: 'polynomial',
            baselineSource: 'given',
            reason: 'Baseline lowered onto the contact points',
          }),
          row({ createdBy: null }),
        ]}
      />,
    );
    const table = screen.getByRole('table', { name: 'Revisions' });
    const cells = within(table)
      .getAllByRole('row')
      .slice(1)
      .map((r) => within(r).getAllByRole('cell').map((c) => c.textContent));
    // Rev., When, Who, Method, Baseline … Reason
    expect(cells[0].slice(0, 5)).toEqual([
      'r2',
      '2 Dec 2026, 14:05 UTC',
      'Rita Reviewer',
      'Polynomial',
      'set by hand',
    ]);
    expect(cells[0][8]).toBe('Baseline lowered onto the contact points');
    expect(cells[1].slice(0, 5)).toEqual([
      'r1',
      '1 Dec 2026, 09:30 UTC',
      'Former member',
      'Young–Laplace',
      'found automatically',
    ]);
    expect(table.textContent).not.toMatch(/young-laplace|polynomial\b/);
  });
});
