import 'server-only';
import { and, eq, isNull } from 'drizzle-orm';
import { HttpError, notFound } from '@/lib/api/errors';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { IMPORT_COLUMNS, type ImportIssue, type ParsedImportRow } from '@/lib/validation/import';
import { getDb } from '../client';
import { analyses, batches, drops, probeLiquids, samples } from '../schema';
import { newId } from './ids';
import { probeLiquidVisibleTo, type Actor } from './records';
import { recordAudit } from './audit';

/** 400 listing every problem of an import file; nothing was imported. */
export function invalidImport(issues: ImportIssue[]): HttpError {
  return new HttpError(
    400,
    'invalid_rows',
    `Nothing was imported: ${issues.length === 1 ? '1 problem was' : `${issues.length} problems were`} found. Correct the rows listed and import the whole file again.`,
    undefined,
    { issues },
  );
}

export type ImportOutcome = { imported: number; dropIds: string[] };

/**
 * Imports hand-read angles into one batch, all or nothing: every row must name a current sample
 * of this batch and a probe liquid of the library or the organization (by id or by name). Each row
 * becomes a drop (source 'import', no photo) with one 'manual' analysis revision, in a single
 * transaction with one audit row.
 */
export async function importManualAngles(
  actor: Actor,
  batchId: string,
  rows: ParsedImportRow[],
): Promise<ImportOutcome> {
  return getDb().transaction(async (tx) => {
    const [batch] = await tx
      .select({ id: batches.id, lotCode: batches.lotCode, archivedAt: batches.archivedAt })
      .from(batches)
      .where(and(eq(batches.id, batchId), eq(batches.organizationId, actor.organizationId)))
      .for('share');
    if (!batch) throw notFound('That batch');
    if (batch.archivedAt) {
      throw new HttpError(
        409,
        'archived',
        'This batch is archived; results can no longer be added to it.',
      );
    }
    const sampleRows = await tx
      .select({ id: samples.id, label: samples.label })
      .from(samples)
      .where(and(eq(samples.batchId, batchId), isNull(samples.archivedAt)))
      .for('share');
    const sampleByLabel = new Map(sampleRows.map((s) => [s.label.toLowerCase(), s.id]));
    const sampleIds = new Set(sampleRows.map((s) => s.id));
    const liquidRows = await tx
      .select({ id: probeLiquids.id, name: probeLiquids.name })
      .from(probeLiquids)
      .where(and(probeLiquidVisibleTo(actor.organizationId), isNull(probeLiquids.archivedAt)));
    const liquidIds = new Set(liquidRows.map((l) => l.id));
    const liquidsByName = new Map<string, string[]>();
    for (const liquid of liquidRows) {
      const key = liquid.name.trim().toLowerCase();
      liquidsByName.set(key, [...(liquidsByName.get(key) ?? []), liquid.id]);
    }

    const issues: ImportIssue[] = [];
    const resolved: { row: ParsedImportRow; sampleId: string; probeLiquidId: string }[] = [];
    for (const row of rows) {
      const sampleId = sampleIds.has(row.sample)
        ? row.sample
        : sampleByLabel.get(row.sample.toLowerCase());
      if (!sampleId) {
        issues.push({
          row: row.row,
          column: IMPORT_COLUMNS.sample.header,
          message: `No sample "${row.sample}" in batch ${batch.lotCode}. Add the sample on the batch page first, or correct the label.`,
        });
      }
      let probeLiquidId: string | undefined;
      if (liquidIds.has(row.probeLiquid)) probeLiquidId = row.probeLiquid;
      else {
        const matches = liquidsByName.get(row.probeLiquid.toLowerCase()) ?? [];
        if (matches.length === 1) probeLiquidId = matches[0];
        else
          issues.push({
            row: row.row,
            column: IMPORT_COLUMNS.probeLiquid.header,
            message:
              matches.length > 1
                ? `Several probe liquids are named "${row.probeLiquid}". Use the id shown on the Probe liquids page.`
                : `No probe liquid "${row.probeLiquid}". Use a name or id from the Probe liquids page.`,
          });
      }
      if (sampleId && probeLiquidId) resolved.push({ row, sampleId, probeLiquidId });
    }
    if (issues.length > 0) throw invalidImport(issues);

    const dropIds: string[] = [];
    const dropValues: (typeof drops.$inferInsert)[] = [];
    const analysisValues: (typeof analyses.$inferInsert)[] = [];
    for (const { row, sampleId, probeLiquidId } of resolved) {
      const dropId = newId();
      dropIds.push(dropId);
      const meanDeg = (row.leftDeg + row.rightDeg) / 2;
      dropValues.push({
        id: dropId,
        organizationId: actor.organizationId,
        sampleId,
        probeLiquidId,
        sessionId: null,
        photoId: null,
        source: 'import',
        measuredAt: row.measuredAt,
        createdByUserId: actor.userId,
      });
      analysisValues.push({
        id: newId(),
        organizationId: actor.organizationId,
        dropId,
        revision: 1,
        method: 'manual',
        baseline: null,
        options: {},
        result: {
          leftDeg: row.leftDeg,
          rightDeg: row.rightDeg,
          meanDeg,
          operator: row.operator,
          note: row.note,
          importedRow: row.row,
        },
        leftDeg: row.leftDeg,
        rightDeg: row.rightDeg,
        meanDeg,
        leftUncertaintyDeg: null,
        rightUncertaintyDeg: null,
        softwareVersion: SOFTWARE_VERSION,
        createdByUserId: actor.userId,
      });
    }
    // Insert in chunks: PostgreSQL takes at most 65 535 parameters per statement.
    for (let i = 0; i < dropValues.length; i += 1000) {
      await tx.insert(drops).values(dropValues.slice(i, i + 1000));
      await tx.insert(analyses).values(analysisValues.slice(i, i + 1000));
    }
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'drop.import',
      entityType: 'batch',
      entityId: batchId,
      after: {
        imported: dropIds.length,
        dropIds,
        samples: [...new Set(resolved.map((r) => r.sampleId))],
      },
    });
    return { imported: dropIds.length, dropIds };
  });
}
