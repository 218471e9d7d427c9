import {
  PROBE_LIQUIDS,
  type ProbeLiquid as LibraryLiquid,
  type ValueSource,
} from '@/lib/surface-energy';
import { and, eq, isNull, sql } from 'drizzle-orm';
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
  return source.citation;
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
    // Built-in rows already present take the library's current citations.
    const recited: string[] = [];
    for (const liquid of PROBE_LIQUID_LIBRARY) {
      const updated = await tx
        .update(probeLiquids)
        .set({ sources: liquid.sources })
        .where(
          and(
            eq(probeLiquids.id, liquid.id),
            isNull(probeLiquids.organizationId),
            sql`${probeLiquids.sources} is distinct from ${JSON.stringify(liquid.sources)}::jsonb`,
          ),
        )
        .returning({ id: probeLiquids.id });
      recited.push(...updated.map((row) => row.id));
    }
    if (recited.length > 0) {
      await recordAudit(tx, {
        actorUserId: null,
        organizationId: null,
        action: 'probe_liquid.library_sources',
        entityType: 'probe_liquid',
        after: { ids: recited },
      });
    }
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
