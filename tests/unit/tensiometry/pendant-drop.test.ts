import seedrandom from 'seedrandom';
import { describe, expect, it } from 'vitest';
import { integrateYoungLaplace } from '@/lib/analysis/young-laplace-profile';
import {
  fitPendantDrop,
  fittedPendantOutline,
  pendantEdgeFromImage,
  MIN_RELIABLE_SHAPE_FACTOR,
  type EdgePoint,
} from '@/lib/tensiometry/pendant-drop';
import { TensiometryInputError } from '@/lib/tensiometry';
import { WATER_PENDANT, renderPendantPhoto } from '../../support/pendant-photo';

const G = 9.80665;

/**
 * Edge of a hanging drop rendered from the Young–Laplace equation (Bashforth & Adams 1883) at a
 * known γ: β = Δρ g b²/γ, integrated with a step 8× finer than the fit's, cut where the profile
 * narrows towards the needle, both sides, in px at `pxPerMm`, with optional seeded noise.
 */
function renderPendantEdge(options: {
  gammaMnM: number;
  densityDifference: number;
  apexRadiusMm: number;
  pxPerMm: number;
  noisePx?: number;
  neckFraction?: number;
}): EdgePoint[] {
  const bM = options.apexRadiusMm * 1e-3;
  const beta = (options.densityDifference * G * bM * bM) / (options.gammaMnM * 1e-3);
  const profile = integrateYoungLaplace(-beta, { maxZ: 6, step: 0.0005 });
  const bPx = options.apexRadiusMm * options.pxPerMm;
  const random = seedrandom('pendant');
  const noise = () => (options.noisePx ?? 0) * (random() * 2 - 1);
  let xmax = 0;
  let pastEquator = false;
  const edge: EdgePoint[] = [];
  for (let k = 1; k < profile.n; k += 40) {
    const x = profile.x[k];
    xmax = Math.max(xmax, x);
    if (profile.phi[k] > Math.PI / 2) pastEquator = true;
    if (pastEquator && x < (options.neckFraction ?? 0.6) * xmax) break;
    const u = x * bPx;
    const v = profile.z[k] * bPx;
    edge.push({ x: 400 + u + noise(), y: 600 - v + noise() });
    edge.push({ x: 400 - u + noise(), y: 600 - v + noise() });
  }
  return edge;
}

const needle = { needleOuterDiameterMm: 1.2, needleOuterDiameterPx: 1.2 * 120 };

describe('fitPendantDrop', () => {
  it('recovers γ of water-like drops within 0.5 %', () => {
    for (const [gamma, b] of [
      [72.0, 1.35],
      [50.0, 1.1],
      [30.0, 0.95],
    ]) {
      const edge = renderPendantEdge({
        gammaMnM: gamma,
        densityDifference: 997,
        apexRadiusMm: b,
        pxPerMm: 120,
      });
      const fit = fitPendantDrop({ edge, densityDifferenceKgPerM3: 997, ...needle });
      expect(Math.abs(fit.surfaceTensionMilliNewtonPerM - gamma) / gamma).toBeLessThan(0.005);
      expect(fit.apexRadiusMm).toBeCloseTo(b, 2);
      expect(fit.rmsResidualPx).toBeLessThan(0.2);
      expect(fit.warnings).toEqual([]);
    }
  });

  it('stays within 0.5 % with ±0.3 px edge noise', () => {
    const edge = renderPendantEdge({
      gammaMnM: 72.0,
      densityDifference: 997,
      apexRadiusMm: 1.35,
      pxPerMm: 120,
      noisePx: 0.3,
    });
    const fit = fitPendantDrop({ edge, densityDifferenceKgPerM3: 997, ...needle });
    expect(Math.abs(fit.surfaceTensionMilliNewtonPerM - 72.0) / 72.0).toBeLessThan(0.005);
    expect(fit.rmsResidualPx).toBeLessThan(0.3);
  });

  it('warns when the drop is too round to be reliable', () => {
    // b = 0.55 mm in water gives β ≈ 0.04, nearly a sphere.
    const edge = renderPendantEdge({
      gammaMnM: 72.0,
      densityDifference: 997,
      apexRadiusMm: 0.55,
      pxPerMm: 200,
      neckFraction: 0.8,
    });
    const fit = fitPendantDrop({
      edge,
      densityDifferenceKgPerM3: 997,
      needleOuterDiameterMm: 0.5,
      needleOuterDiameterPx: 100,
    });
    expect(fit.shapeFactor).toBeLessThan(MIN_RELIABLE_SHAPE_FACTOR);
    expect(fit.warnings.join(' ')).toMatch(/too round/);
  });

  it('rejects too few points and bad scale', () => {
    expect(() =>
      fitPendantDrop({ edge: [{ x: 1, y: 1 }], densityDifferenceKgPerM3: 997, ...needle }),
    ).toThrow(TensiometryInputError);
    const edge = renderPendantEdge({
      gammaMnM: 72,
      densityDifference: 997,
      apexRadiusMm: 1.35,
      pxPerMm: 120,
    });
    expect(() =>
      fitPendantDrop({
        edge,
        densityDifferenceKgPerM3: 997,
        needleOuterDiameterMm: 0,
        needleOuterDiameterPx: 200,
      }),
    ).toThrow(/Needle outer diameter/);
  });
});

describe('pendantEdgeFromImage', () => {
  it('finds the needle and the outline, and the fit gives γ within 0.5 %', () => {
    // Rendered from the Young–Laplace equation at γ = 72 mN/m (water, Δρ = 997 kg/m³,
    // b = 1.35 mm, 60 px/mm) under a 1.20 mm needle: tests/support/pendant-photo.ts.
    const photo = renderPendantPhoto(WATER_PENDANT);
    const extraction = pendantEdgeFromImage(photo);
    expect(extraction.needleOuterDiameterPx).toBeCloseTo(photo.needleOuterDiameterPx, 0);
    const fit = fitPendantDrop({
      edge: extraction.edge,
      needleOuterDiameterMm: 1.2,
      needleOuterDiameterPx: extraction.needleOuterDiameterPx,
      densityDifferenceKgPerM3: 997,
    });
    expect(Math.abs(fit.surfaceTensionMilliNewtonPerM - 72) / 72).toBeLessThan(0.005);
    expect(fit.rmsResidualPx).toBeLessThan(0.5);
  });

  it('draws the fitted profile over the photo where the rendered drop is', () => {
    const photo = renderPendantPhoto(WATER_PENDANT);
    const extraction = pendantEdgeFromImage(photo);
    const fit = fitPendantDrop({
      edge: extraction.edge,
      needleOuterDiameterMm: 1.2,
      needleOuterDiameterPx: extraction.needleOuterDiameterPx,
      densityDifferenceKgPerM3: 997,
    });
    const outline = fittedPendantOutline(fit, extraction.needleTipY);
    expect(outline.length).toBeGreaterThan(100);
    const ys = outline.map((p) => p.y);
    const xs = outline.map((p) => p.x);
    // The apex is rendered at (160.3, 330.6) in continuous image coordinates, which is
    // (159.8, 330.1) with pixel centres at whole numbers, as the outline is given.
    expect(Math.max(...ys)).toBeCloseTo(WATER_PENDANT.apexY - 0.5, 0);
    expect((Math.max(...xs) + Math.min(...xs)) / 2).toBeCloseTo(WATER_PENDANT.axisX - 0.5, 0);
    // It ends at the needle tip.
    expect(Math.min(...ys)).toBeCloseTo(extraction.needleTipY, 0);
    // Its widest span is the drop's equator as found in the photo.
    const edgeXs = extraction.edge.map((p) => p.x);
    expect(Math.max(...xs) - Math.min(...xs)).toBeCloseTo(
      Math.max(...edgeXs) - Math.min(...edgeXs),
      0,
    );
    // Left side first, top to apex, then the right side back up.
    expect(outline[0].x).toBeLessThan(WATER_PENDANT.axisX - 0.5);
    expect(outline[outline.length - 1].x).toBeGreaterThan(WATER_PENDANT.axisX - 0.5);
  });

  it('says so when there is no drop', () => {
    const blank = { width: 100, height: 100, data: new Uint8Array(100 * 100).fill(200) };
    expect(() => pendantEdgeFromImage(blank)).toThrow(TensiometryInputError);
  });
});
