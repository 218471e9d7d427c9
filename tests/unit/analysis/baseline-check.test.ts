/**
 * A baseline that does not meet the drop where the drop meets the substrate is named as the cause,
 * with the side, the distance and the point it misses. Truth: the generator's contact points and
 * substrate line (fixtures/generator/render.ts, Young–Laplace profile).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { analyseDropWith, loadOpenCv, type OpenCv } from '@/lib/analysis';
import { renderDrop } from '@/fixtures/generator/render';

let cv: OpenCv;
beforeAll(async () => {
  ({ cv } = await loadOpenCv());
});

const drop = renderDrop({ contactAngleDeg: 80, bond: 0.2, halfWidthPx: 150, seed: 3 });
const truth = drop.truth.baseline;

describe('baseline check', () => {
  it('a hand baseline dragged 28 px down at its right end: named, with where it misses', () => {
    const given = { ...truth, y2: truth.y2 + 28 };
    // Where the dragged line passes under each true contact point (linear along x).
    const dropAt = (x: number) => ((given.y2 - given.y1) * (x - given.x1)) / (given.x2 - given.x1);
    const expectedLeft = dropAt(drop.truth.contactLeft[0]);
    const expectedRight = dropAt(drop.truth.contactRight[0]);
    for (const method of ['circle', 'polynomial', 'young-laplace', 'ellipse', 'height-width'] as const) {
      const r = analyseDropWith(cv, drop.image, { method, baseline: given });
      const misses = r.warnings.filter((w) => w.code === 'baseline_off_contact');
      expect(misses).toHaveLength(2);
      const distance = (text: string) => Number(/passes ([\d.]+) px below/.exec(text)?.[1]);
      expect(misses[0].message).toMatch(/left contact point \(x 1\d\d\.\d, y 330\.0\)/);
      expect(misses[1].message).toMatch(/right contact point \(x 4\d\d\.\d, y 330\.0\)/);
      expect(Math.abs(distance(misses[0].message) - expectedLeft)).toBeLessThan(0.5);
      expect(Math.abs(distance(misses[1].message) - expectedRight)).toBeLessThan(0.5);
      // Not blamed on the image border: the substrate's own edge is not taken for the drop.
      expect(r.warnings.map((w) => w.code)).not.toContain('drop_cut_by_border');
      // The profile is extended to the baseline, not replaced by the substrate line: the angles stay
      // those of a drop, within what 7–21 px of extension changes.
      for (const angle of [r.leftDeg, r.rightDeg]) expect(Math.abs(angle - 80)).toBeLessThan(15);
    }
  });

  it('a hand baseline 3 px above the substrate says so on both sides; the found one is silent', () => {
    const raised = { ...truth, y1: truth.y1 - 3, y2: truth.y2 - 3 };
    const r = analyseDropWith(cv, drop.image, { method: 'young-laplace', baseline: raised });
    const messages = r.warnings.filter((w) => w.code === 'baseline_off_contact').map((w) => w.message);
    expect(messages).toEqual([
      expect.stringMatching(/passes 3\.\d px above the left contact point/),
      expect.stringMatching(/passes 3\.\d px above the right contact point/),
    ]);
    const automatic = analyseDropWith(cv, drop.image, { method: 'young-laplace' });
    expect(automatic.warnings.map((w) => w.code)).not.toContain('baseline_off_contact');
    const exact = analyseDropWith(cv, drop.image, { method: 'young-laplace', baseline: truth });
    expect(exact.warnings.map((w) => w.code)).not.toContain('baseline_off_contact');
  });
});
