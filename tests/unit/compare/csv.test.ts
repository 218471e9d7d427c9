import { describe, expect, it } from 'vitest';
import { CSV_HEADER, dropsCsv } from '@/lib/compare';

const row = {
  coatingCode: 'HT-200',
  lotCode: 'B-0412',
  producedOn: '2026-11-16',
  sampleLabel: 'P1, coil "start"',
  liquidName: 'Water',
  dropId: 'D1',
  revision: 2,
  reviewStatus: 'draft',
  measuredAt: '2026-11-18T10:00:00.000Z',
  treatedAt: '2026-11-16T08:00:00.000Z',
  leftDeg: 101.23456,
  rightDeg: 102,
  meanDeg: 101.61728,
};

describe('dropsCsv', () => {
  it('writes a UTF-8 header with units and one line per drop', () => {
    const csv = dropsCsv([row]);
    expect(csv.startsWith('\uFEFF')).toBe(true);
    const lines = csv.slice(1).trimEnd().split('\r\n');
    expect(lines[0]).toBe(CSV_HEADER.join(','));
    expect(lines[0]).toContain('Left angle (°)');
    expect(lines[1]).toBe(
      'HT-200,B-0412,2026-11-16,"P1, coil ""start""",Water,D1,2,draft,2026-11-18T10:00:00.000Z,2026-11-16T08:00:00.000Z,2.08,101.235,102.000,101.617',
    );
  });

  it('keeps a label from becoming a spreadsheet formula', () => {
    const csv = dropsCsv([{ ...row, sampleLabel: '=1+1', treatedAt: null }]);
    const line = csv.slice(1).split('\r\n')[1];
    expect(line).toContain(",'=1+1,");
    expect(line).toContain('2026-11-18T10:00:00.000Z,,,');
  });
});
