import {
  PROBE_LIQUIDS,
  type ProbeLiquid as LibraryLiquid,
  type ValueSource,
} from '@/lib/surface-energy';
import type { Database } from './client';
import { recordAudit } from './queries/audit';
import { probeLiquids } from './schema';

/*
 * The built-in probe-liquid library: shared by every organization (organization_id null) and
 * read-only through the API. The values come from lib/surface-energy's PROBE_LIQUIDS, so the
 * computation and the records use the same numbers.
 */

export type BuiltInProbeLiquid = typeof probeLiquids.$inferInsert & {
  id: `liquid-${LibraryLiquid['id']}`;
};

/** Stable id of a built-in liquid, e.g. 'liquid-water'; specs and drops refer to it. */
export const builtInProbeLiquidId = (id: LibraryLiquid['id']) => `liquid-${id}` as const;

function cite(source: ValueSource): string {
  return source.fromMemory
    ? `${source.citation} (from memory; confirm against the original)`
    : source.citation;
}

function toRow(liquid: LibraryLiquid): BuiltInProbeLiquid {
  const split = cite(liquid.sources.split);
  const acidBase = cite(liquid.sources.acidBase);
  return {
    id: builtInProbeLiquidId(liquid.id),
    organizationId: null,
    name: liquid.name,
    totalMnM: liquid.gammaTotal,
    dispersiveMnM: liquid.gammaDispersive,
    polarMnM: liquid.gammaPolar,
    lifshitzVanDerWaalsMnM: liquid.gammaLW ?? null,
    acidMnM: liquid.gammaPlus ?? null,
    baseMnM: liquid.gammaMinus ?? null,
    densityGPerCm3: liquid.densityGPerCm3,
    sources: {
      total: split,
      dispersive: split,
      polar: split,
      lifshitzVanDerWaals: acidBase,
      acid: acidBase,
      base: acidBase,
      density: cite(liquid.sources.density),
    },
    hazardNote: liquid.hazardNote,
  };
}

/** Water, diiodomethane, ethylene glycol, formamide and glycerol, as database rows. */
export const PROBE_LIQUID_LIBRARY: readonly BuiltInProbeLiquid[] =
  Object.values(PROBE_LIQUIDS).map(toRow);

/**
 * Inserts the built-in liquids that are missing (by their stable ids); rows already present
 * are left as they are. Returns the ids it inserted.
 */
export async function ensureProbeLiquidLibrary(db: Database): Promise<string[]> {
  return db.transaction(async (tx) => {
    const inserted = await tx
      .insert(probeLiquids)
      .values([...PROBE_LIQUID_LIBRARY])
      .onConflictDoNothing({ target: probeLiquids.id })
      .returning({ id: probeLiquids.id });
    const ids = inserted.map((row) => row.id);
    if (ids.length > 0) {
      await recordAudit(tx, {
        actorUserId: null,
        organizationId: null,
        action: 'probe_liquid.library_seed',
        entityType: 'probe_liquid',
        after: { ids },
      });
    }
    return ids;
  });
}
