/** The CLI contract of `npm run analyze` (scripts/analyze.ts). */
import { describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';

const root = path.resolve(__dirname, '../../..');

describe('analyze CLI', () => {
  it('prints one JSON line per file in input order, an error line for an unreadable file, exit status 1', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'beadline-cli-'));
    const broken = path.join(dir, 'broken.png');
    writeFileSync(broken, 'this is not an image');
    const files = [
      'fixtures/drops/drop-90-tilted.png',
      broken,
      'fixtures/drops/drop-65-bitmap.bmp',
    ];
    const run = spawnSync(
      'npx',
      ['tsx', 'scripts/analyze.ts', '--json', '--method', 'circle', ...files],
      {
        cwd: root,
        encoding: 'utf8',
        timeout: 120_000,
      },
    );
    expect(run.status).toBe(1);
    const lines = run.stdout.trim().split('\n');
    expect(lines).toHaveLength(3);
    const parsed = lines.map((line) => JSON.parse(line) as Record<string, unknown>);
    expect(parsed.map((p) => p.file)).toEqual(files);

    for (const ok of [parsed[0], parsed[2]]) {
      for (const key of [
        'leftDeg',
        'rightDeg',
        'meanDeg',
        'leftUncertaintyDeg',
        'rightUncertaintyDeg',
        'baseDiameterPx',
        'heightPx',
        'rmsResidualPx',
        'timeMs',
      ]) {
        expect(typeof ok[key]).toBe('number');
      }
      expect(ok.method).toBe('circle');
      const baseline = ok.baseline as Record<string, number>;
      expect(Object.keys(baseline).sort()).toEqual(['x1', 'x2', 'y1', 'y2']);
      expect((ok.contactLeft as number[]).length).toBe(2);
      expect((ok.contactRight as number[]).length).toBe(2);
      expect(Array.isArray(ok.warnings)).toBe(true);
    }
    // Circle fit on β = 0.1 drops: gravity costs it about 1.4° at 90° (see docs/analysis-accuracy.md).
    expect(Math.abs((parsed[0].meanDeg as number) - 90)).toBeLessThan(2);
    expect(Math.abs((parsed[2].meanDeg as number) - 65)).toBeLessThan(1);
    const error = parsed[1].error as { code: string; message: string };
    expect(error.code).toBe('unreadable_image');
    expect(error.message.length).toBeGreaterThan(0);
    expect(Object.keys(parsed[1]).sort()).toEqual(['error', 'file']);
  }, 120_000);

  it('uses a given baseline and scale, and prints a table without --json', () => {
    const json = spawnSync(
      'npx',
      [
        'tsx',
        'scripts/analyze.ts',
        '--baseline',
        '0,330,639,330',
        '--scale',
        '100',
        '--json',
        'fixtures/drops/cap-60-noisy.png',
      ],
      { cwd: root, encoding: 'utf8', timeout: 120_000 },
    );
    expect(json.status).toBe(0);
    const result = JSON.parse(json.stdout.trim()) as Record<string, unknown>;
    expect(result.baseline).toEqual({ x1: 0, y1: 330, x2: 639, y2: 330 });
    expect(result.method).toBe('young-laplace');
    expect(typeof result.volumeUl).toBe('number');
    const table = spawnSync(
      'npx',
      ['tsx', 'scripts/analyze.ts', 'fixtures/drops/cap-60-noisy.png'],
      { cwd: root, encoding: 'utf8', timeout: 120_000 },
    );
    expect(table.status).toBe(0);
    expect(table.stdout).toMatch(/left°/);
    expect(table.stdout).toMatch(/cap-60-noisy\.png/);
  }, 120_000);
});
