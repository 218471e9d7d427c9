/**
 * The series generator (fixtures/generator/series*.ts): its physics against outside references,
 * and the committed frames against what the generator draws today.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { decodeImageFile } from '@/lib/analysis/node/decode';
import {
  NEEDLE_SERIES,
  STANDARD_GRAVITY,
  WATER_25C,
  bondNumber,
  dropWithBaseRadius,
  dropWithHeight,
  dropWithVolume,
  needleFrameTruth,
} from '@/fixtures/generator/series';
import { TILT_SERIES, tiltFrameTruth } from '@/fixtures/generator/series-tilt';
import { COMMITTED_SERIES } from '@/fixtures/generator/series-catalog';

const root = path.resolve(__dirname, '../../..');
const water = { ...WATER_25C, scalePxPerMm: 100 };

describe('series physics', () => {
  it('Bond number: β = (b / ℓc)², water’s capillary length about 2.7 mm (REFERENCES.md, common practice)', () => {
    const capillaryLengthMm =
      1000 *
      Math.sqrt(
        WATER_25C.surfaceTensionMnPerM /
          1000 /
          (WATER_25C.densityDifferenceKgPerM3 * STANDARD_GRAVITY),
      );
    expect(capillaryLengthMm).toBeGreaterThan(2.65);
    expect(capillaryLengthMm).toBeLessThan(2.75);
    expect(bondNumber(capillaryLengthMm * 100, water)).toBeCloseTo(1, 12);
    expect(bondNumber(150, water)).toBeCloseTo((1.5 / capillaryLengthMm) ** 2, 12);
    expect(bondNumber(150, { ...water, gravityFactor: 0.5 })).toBeCloseTo(
      0.5 * bondNumber(150, water),
      12,
    );
  });

  it('water surface tension at 25 °C from the IAPWS R1-76(2014) formula (REFERENCES.md)', () => {
    const tau = 1 - 298.15 / 647.096;
    const gamma = 235.8 * tau ** 1.256 * (1 - 0.625 * tau);
    expect(WATER_25C.surfaceTensionMnPerM).toBeCloseTo(gamma, 2);
  });

  it('a drop too small for gravity is a spherical cap: tan(θ/2) = h/a, V = πh²(3R − h)/3 (REFERENCES.md)', () => {
    // 5 µm apex radius: β ≈ 3e-6.
    const tiny = { ...water, scalePxPerMm: 40000 };
    for (const theta of [40, 90, 130]) {
      const s = dropWithBaseRadius(theta, 150, tiny);
      expect(s.bond).toBeLessThan(1e-5);
      expect(s.baseRadiusPx).toBeCloseTo(150, 6);
      const capR = s.baseRadiusPx / Math.sin((theta * Math.PI) / 180);
      const h = capR * (1 - Math.cos((theta * Math.PI) / 180));
      expect(Math.tan((theta * Math.PI) / 360)).toBeCloseTo(h / s.baseRadiusPx, 3);
      expect(s.heightPx / h).toBeCloseTo(1, 3);
      expect(s.volumePx3 / ((Math.PI * h * h * (3 * capR - h)) / 3)).toBeCloseTo(1, 3);
    }
  });

  it('a large drop flattens to a puddle of height 2 ℓc sin(θ/2) (de Gennes, Brochard-Wyart & Quéré 2004)', () => {
    const capillaryLengthPx =
      100000 *
      Math.sqrt(
        WATER_25C.surfaceTensionMnPerM /
          1000 /
          (WATER_25C.densityDifferenceKgPerM3 * STANDARD_GRAVITY),
      );
    const puddle = dropWithBaseRadius(90, 40 * capillaryLengthPx, water);
    const limit = 2 * capillaryLengthPx * Math.sin(Math.PI / 4);
    expect(puddle.bond).toBeGreaterThan(100);
    expect(Math.abs(puddle.heightPx / limit - 1)).toBeLessThan(0.01);
  });

  it('the solvers hit their targets: base radius, volume, height', () => {
    expect(dropWithBaseRadius(100, 123.4, water).baseRadiusPx).toBeCloseTo(123.4, 8);
    expect(dropWithVolume(70, 3e6, water).volumePx3 / 3e6).toBeCloseTo(1, 9);
    expect(dropWithHeight(80, 91.5, water).heightPx).toBeCloseTo(91.5, 8);
  });

  it('needle-in: base pinned while the angle changes, angle constant while the base moves', () => {
    const t = Array.from({ length: 50 }, (_, i) => needleFrameTruth(NEEDLE_SERIES, i));
    for (let i = 1; i < t.length; i++) {
      if (t[i].phase === 'pinned' && t[i - 1].phase === 'pinned')
        expect(t[i].baseDiameterPx).toBeCloseTo(t[i - 1].baseDiameterPx, 6);
      if (t[i].phase === 'advancing') expect(t[i].contactAngleDeg).toBe(NEEDLE_SERIES.advancingDeg);
      if (t[i].phase === 'receding') expect(t[i].contactAngleDeg).toBe(NEEDLE_SERIES.recedingDeg);
      // β grows with the square of the apex radius: the larger drop is the flatter one.
      expect(t[i].bond / t[i - 1].bond).toBeCloseTo(
        (t[i].apexRadiusPx / t[i - 1].apexRadiusPx) ** 2,
        9,
      );
    }
  });

  it('tilting plate: level drop symmetric; pinned rear until roll-off; receding and advancing angles then', () => {
    const level = tiltFrameTruth(TILT_SERIES, 0);
    expect(level.downhillDeg).toBe(level.uphillDeg);
    expect(level.uphillBond).toBeCloseTo(level.downhillBond, 12);
    const rest = level.contactLeftX;
    for (let i = 1; i < TILT_SERIES.frameCount; i++) {
      const t = tiltFrameTruth(TILT_SERIES, i);
      if (t.tiltDeg <= TILT_SERIES.rollOffTiltDeg) expect(t.contactLeftX).toBeCloseTo(rest, 6);
      else {
        expect(t.contactLeftX).toBeGreaterThan(rest);
        expect(t.uphillDeg).toBe(TILT_SERIES.recedingDeg);
        expect(t.downhillDeg).toBe(TILT_SERIES.advancingDeg);
      }
      if (t.tiltDeg <= TILT_SERIES.creepTiltDeg)
        expect(t.contactRightX).toBeCloseTo(level.contactRightX, 6);
    }
  });
});

describe('committed series', () => {
  for (const series of COMMITTED_SERIES) {
    it(`${series.name}: the generator still draws the committed frames and truth`, async () => {
      const dir = path.join(root, 'fixtures/series', series.name);
      const manifest = JSON.parse(readFileSync(path.join(dir, 'manifest.json'), 'utf8')) as {
        frameCount: number;
        fps: number;
        frames: ({ file: string } & Record<string, unknown>)[];
      };
      expect(manifest.frameCount).toBe(series.frameCount);
      expect(manifest.fps).toBe(series.fps);
      for (const index of [0, Math.floor(series.frameCount / 2), series.frameCount - 1]) {
        const committed = await decodeImageFile(path.join(dir, manifest.frames[index].file));
        const drawn = series.render(index);
        // Identical but for last-digit differences of Math functions across platforms.
        let differing = 0;
        for (let k = 0; k < drawn.data.length; k++) {
          const d = Math.abs(drawn.data[k] - committed.data[k]);
          expect(d).toBeLessThanOrEqual(1);
          if (d) differing++;
        }
        expect(differing / drawn.data.length).toBeLessThan(0.001);
        const truth = series.truth(index) as Record<string, unknown>;
        for (const [key, value] of Object.entries(truth)) {
          // The manifest keeps 10 significant digits.
          if (typeof value === 'number')
            expect(Math.abs((manifest.frames[index][key] as number) - value)).toBeLessThanOrEqual(
              1e-9 * Math.abs(value) + 1e-12,
            );
          else expect(manifest.frames[index][key]).toEqual(value);
        }
      }
    });
  }
});
