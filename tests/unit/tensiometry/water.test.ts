/**
 * Water surface tension by IAPWS R1-76(2014), Revised Release on Surface Tension of Ordinary
 * Water Substance. Table values below are from memory of the release's table (two decimals);
 * cross-check: each is also recomputed here from the release's formula, written out
 * independently of the code under test.
 */
import { describe, expect, it } from 'vitest';
import { checkWaterProbe, TensiometryInputError, waterSurfaceTension } from '@/lib/tensiometry';

/** γ = B τ^μ (1 + b τ), τ = 1 − T/Tc; Tc = 647.096 K, B = 235.8 mN/m, b = −0.625, μ = 1.256. */
function iapwsByHand(celsius: number): number {
  const tau = 1 - (celsius + 273.15) / 647.096;
  return 235.8 * tau ** 1.256 * (1 - 0.625 * tau);
}

describe('IAPWS R1-76(2014) water surface tension', () => {
  it.each([
    [0.01, 75.65],
    [20, 72.74],
    [25, 71.97],
    [100, 58.91],
  ])(
    '%s °C gives %s mN/m (release table, from memory; formula recomputed in the test)',
    (t, table) => {
      expect(Math.abs(waterSurfaceTension(t) - table)).toBeLessThanOrEqual(0.005);
      expect(Math.abs(iapwsByHand(t) - table)).toBeLessThanOrEqual(0.005);
      expect(waterSurfaceTension(t)).toBeCloseTo(iapwsByHand(t), 12);
    },
  );

  it('falls with temperature and vanishes at the critical point', () => {
    expect(waterSurfaceTension(30)).toBeLessThan(waterSurfaceTension(20));
    expect(waterSurfaceTension(647.096 - 273.15)).toBeCloseTo(0, 12);
  });

  it('refuses temperatures outside 0.01 °C … Tc with a plain message', () => {
    expect(() => waterSurfaceTension(0)).toThrow(TensiometryInputError);
    expect(() => waterSurfaceTension(400)).toThrow(/0.01 °C/);
    expect(() => waterSurfaceTension(Number.NaN)).toThrow(/enter a number/);
  });
});

describe('probe-liquid check (water against IAPWS)', () => {
  it('within the default 1.0 mN/m tolerance', () => {
    const c = checkWaterProbe(72.3, 20);
    expect(c.flag).toBe('within-tolerance');
    expect(c.deviationMilliNewtonPerM).toBeCloseTo(72.3 - iapwsByHand(20), 10);
  });
  it('low reading is flagged as likely contamination', () => {
    const c = checkWaterProbe(70.5, 25);
    expect(c.flag).toBe('low-likely-contamination');
    expect(c.message).toMatch(/contaminated/);
  });
  it('high reading points at the instrument; the lab sets the tolerance', () => {
    expect(checkWaterProbe(73.5, 25).flag).toBe('high-check-instrument');
    expect(checkWaterProbe(73.5, 25, { toleranceMilliNewtonPerM: 2 }).flag).toBe(
      'within-tolerance',
    );
    expect(checkWaterProbe(72.3, 20, { toleranceMilliNewtonPerM: 0.2 }).flag).toBe(
      'low-likely-contamination',
    );
  });
  it('rejects negative readings and tolerances', () => {
    expect(() => checkWaterProbe(-1, 20)).toThrow(TensiometryInputError);
    expect(() => checkWaterProbe(72, 20, { toleranceMilliNewtonPerM: -1 })).toThrow(/positive/);
  });
});
