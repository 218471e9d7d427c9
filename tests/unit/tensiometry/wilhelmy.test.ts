/**
 * Wilhelmy plate (Wilhelmy 1863): F = γ p cos θ + W − ρ g w t d, p = 2(w + t). Checks by
 * independent arithmetic in SI units written out in the test.
 */
import { describe, expect, it } from 'vitest';
import {
  buoyancyMilliNewton,
  TensiometryInputError,
  waterSurfaceTension,
  wettedPerimeterMm,
  wilhelmyContactAngle,
  wilhelmyForceMilliNewton,
  wilhelmySurfaceTension,
} from '@/lib/tensiometry';

const plate = { widthMm: 19.9, thicknessMm: 0.1 }; // a typical platinum plate size (invented example)

describe('Wilhelmy plate', () => {
  it('wetted perimeter is 2(w + t)', () => {
    expect(wettedPerimeterMm(plate)).toBeCloseTo(40, 12);
  });

  it('θ = 0 reproduces the liquid’s tension: water at 20 °C (IAPWS) on a just-touching plate', () => {
    const gamma = waterSurfaceTension(20);
    // SI by hand: F = γ[N/m]·p[m] = 0.07274 N/m × 0.040 m ≈ 2.9094 mN.
    const forceMilliNewton = (gamma / 1000) * 0.04 * 1000;
    expect(forceMilliNewton).toBeCloseTo(2.9094, 3);
    const r = wilhelmySurfaceTension({ plate, forceMilliNewton });
    expect(r.surfaceTensionMilliNewtonPerM).toBeCloseTo(gamma, 10);
    expect(r.buoyancyMilliNewton).toBe(0);
    expect(r.contactAngleDeg).toBe(0);
  });

  it('buoyancy: size by hand in SI, and the correction is added back to the reading', () => {
    // ρ = 0.998 g/cm³ = 998 kg/m³; V = 19.9 × 0.1 × 2 mm³ = 3.98e−9 m³;
    // B = 998 × 9.80665 × 3.98e−9 N = 3.8952e−5 N = 0.038952 mN.
    const expected = 998 * 9.80665 * 3.98e-9 * 1000;
    const b = buoyancyMilliNewton(plate, 2, 0.998);
    expect(b).toBeCloseTo(expected, 12);
    expect(b).toBeCloseTo(0.03895, 5);
    // A deeper plate reads less force for the same liquid; the solved γ stays the same.
    const gamma = 72.74;
    const immersed = { plate, immersionDepthMm: 2, liquidDensityGPerCm3: 0.998 };
    const f = wilhelmyForceMilliNewton(gamma, immersed);
    expect(f).toBeCloseTo(gamma * 0.04 - expected, 12);
    const r = wilhelmySurfaceTension({ ...immersed, forceMilliNewton: f });
    expect(r.surfaceTensionMilliNewtonPerM).toBeCloseTo(gamma, 10);
    // Ignoring buoyancy would under-read by B/p = 0.038952 mN / 0.04 m ≈ 0.97 mN/m.
    const naive = wilhelmySurfaceTension({
      plate,
      forceMilliNewton: f,
    }).surfaceTensionMilliNewtonPerM;
    expect(gamma - naive).toBeCloseTo(expected / 0.04, 10);
  });

  it('plate weight is subtracted when the balance was not tared with the plate', () => {
    const r = wilhelmySurfaceTension({
      plate,
      forceMilliNewton: 2.9096 + 50,
      plateWeightMilliNewton: 50,
    });
    expect(r.surfaceTensionMilliNewtonPerM).toBeCloseTo(2.9096 / 0.04, 10);
  });

  it('contact angle on a plate of another material: cos θ = F/(γ p) (water, θ = 105° forward-computed)', () => {
    const f = 72.8 * 0.04 * Math.cos((105 * Math.PI) / 180);
    const r = wilhelmyContactAngle({ plate, forceMilliNewton: f }, 72.8);
    expect(r.contactAngleDeg).toBeCloseTo(105, 10);
    expect(wilhelmyForceMilliNewton(72.8, { plate, contactAngleDeg: 105 })).toBeCloseTo(f, 12);
  });

  it('a force no angle can explain, or bad dimensions, throw TensiometryInputError', () => {
    expect(() => wilhelmyContactAngle({ plate, forceMilliNewton: 5 }, 72.8)).toThrow(
      /outside −1…1/,
    );
    expect(() =>
      wilhelmySurfaceTension({ plate: { widthMm: -1, thicknessMm: 0.1 }, forceMilliNewton: 3 }),
    ).toThrow(TensiometryInputError);
    expect(() => wilhelmySurfaceTension({ plate, forceMilliNewton: Number.NaN })).toThrow(
      /enter a number/,
    );
    expect(() => wilhelmySurfaceTension({ plate, forceMilliNewton: -0.5 })).toThrow(/not positive/);
    expect(() =>
      wilhelmySurfaceTension({ plate, forceMilliNewton: 2.9 }, { contactAngleDeg: 95 }),
    ).toThrow(/wets/);
    expect(() =>
      wilhelmySurfaceTension({ plate, forceMilliNewton: 2.9, immersionDepthMm: 2 }),
    ).toThrow(/needs the liquid density/);
  });
});
