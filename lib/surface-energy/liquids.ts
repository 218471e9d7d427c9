import type { LiquidComponents } from './types';

/**
 * Where a probe-liquid value comes from: a published work a lab can look up (authors, title,
 * journal or edition, year, and the table). docs/probe-liquids.md says which values were
 * cross-checked against a second source and which could not be.
 */
export interface ValueSource {
  citation: string;
}

export interface ProbeLiquid extends LiquidComponents {
  id: 'water' | 'diiodomethane' | 'ethylene-glycol' | 'formamide' | 'glycerol';
  /** Density near room temperature, g/cm³. */
  densityGPerCm3: number;
  densityTemperatureC: number;
  /** Handling caution shown with the liquid; null where none beyond ordinary lab practice. */
  hazardNote: string | null;
  sources: {
    /** Total, dispersive and polar components. */
    split: ValueSource;
    /** γLW, γ+ and γ− (van Oss–Chaudhury–Good). */
    acidBase: ValueSource;
    density: ValueSource;
  };
}

const STROM_1987: ValueSource = {
  citation:
    'Ström, Fredriksson & Stenius, “Contact angles, work of adhesion, and interfacial tensions at a dissolving hydrocarbon surface”, J. Colloid Interface Sci. 119 (1987) 352–361, table of liquid surface-tension components (20 °C)',
};
const VAN_OSS_1988: ValueSource = {
  citation:
    'van Oss, Chaudhury & Good, “Interfacial Lifshitz–van der Waals and polar interactions in macroscopic systems”, Chem. Rev. 88 (1988) 927–941, table of liquid surface-tension components (20 °C)',
};
const CRC_DENSITY: ValueSource = {
  citation:
    'CRC Handbook of Chemistry and Physics, tables “Physical constants of organic compounds” and “Properties of water in the range 0–100 °C” (20 °C)',
};

const HARMFUL =
  'Harmful: handle per the supplier’s safety data sheet, with the lab’s protective equipment and ventilation.';

/**
 * Probe-liquid library. Components in mN/m at 20 °C, each group with its published source (see
 * `sources`; docs/probe-liquids.md says how far each was cross-checked).
 * Internal consistency (checked in the tests): total = dispersive + polar, and
 * total = γLW + 2√(γ+γ−) to within 0.1 mN/m.
 */
export const PROBE_LIQUIDS: Readonly<Record<ProbeLiquid['id'], ProbeLiquid>> = {
  water: {
    id: 'water',
    name: 'Water',
    gammaTotal: 72.8,
    gammaDispersive: 21.8,
    gammaPolar: 51.0,
    gammaLW: 21.8,
    gammaPlus: 25.5,
    gammaMinus: 25.5,
    densityGPerCm3: 0.998,
    densityTemperatureC: 20,
    hazardNote: null,
    sources: { split: STROM_1987, acidBase: VAN_OSS_1988, density: CRC_DENSITY },
  },
  diiodomethane: {
    id: 'diiodomethane',
    name: 'Diiodomethane',
    gammaTotal: 50.8,
    gammaDispersive: 50.8,
    gammaPolar: 0,
    gammaLW: 50.8,
    gammaPlus: 0,
    gammaMinus: 0,
    densityGPerCm3: 3.325,
    densityTemperatureC: 20,
    hazardNote: `${HARMFUL} Light-sensitive; keep in a dark bottle.`,
    sources: { split: STROM_1987, acidBase: VAN_OSS_1988, density: CRC_DENSITY },
  },
  'ethylene-glycol': {
    id: 'ethylene-glycol',
    name: 'Ethylene glycol',
    gammaTotal: 48.0,
    gammaDispersive: 29.0,
    gammaPolar: 19.0,
    gammaLW: 29.0,
    gammaPlus: 1.92,
    gammaMinus: 47.0,
    densityGPerCm3: 1.113,
    densityTemperatureC: 20,
    hazardNote: HARMFUL,
    sources: { split: STROM_1987, acidBase: VAN_OSS_1988, density: CRC_DENSITY },
  },
  formamide: {
    id: 'formamide',
    name: 'Formamide',
    gammaTotal: 58.0,
    gammaDispersive: 39.0,
    gammaPolar: 19.0,
    gammaLW: 39.0,
    gammaPlus: 2.28,
    gammaMinus: 39.6,
    densityGPerCm3: 1.133,
    densityTemperatureC: 20,
    hazardNote: HARMFUL,
    sources: { split: STROM_1987, acidBase: VAN_OSS_1988, density: CRC_DENSITY },
  },
  glycerol: {
    id: 'glycerol',
    name: 'Glycerol',
    gammaTotal: 64.0,
    gammaDispersive: 34.0,
    gammaPolar: 30.0,
    gammaLW: 34.0,
    gammaPlus: 3.92,
    gammaMinus: 57.4,
    densityGPerCm3: 1.261,
    densityTemperatureC: 20,
    hazardNote:
      'Low hazard; handle per the supplier’s safety data sheet. Hygroscopic: keep closed, as absorbed water changes its tension.',
    sources: { split: STROM_1987, acidBase: VAN_OSS_1988, density: CRC_DENSITY },
  },
};
