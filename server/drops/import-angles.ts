import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { insertDropsAndAnalyses, type NewAnalysis, type NewDrop } from '@/db/queries/drops';
import { newId } from '@/db/queries/ids';
import {
  liveProbeLiquidNames,
  lockBatchForImport,
  lockLiveSamplesOfBatch,
} from '@/db/queries/import';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, notFound } from '@/lib/app-error';
import {
  IMPORT_COLUMNS,
  type ImportIssue,
  type ImportOutcome,
  type ParsedImportRow,
} from '@/lib/contracts/import';
import { parseImportCsv } from '@/lib/csv/import';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import type { Actor } from '../actor';
import { refreshBatchVerdictQuietly } from '../alerts/refresh-verdict';
import { emitWebhookEvents } from '../webhooks/emit';

/** 400 listing every problem of an import file; nothing was imported. */
function invalidImport(issues: ImportIssue[]): AppError {
  return new AppError(
    'invalid_rows',
    `Nothing was imported: ${issues.length === 1 ? '1 problem was' : `${issues.length} problems were`} found. Correct the rows listed and import the whole file again.`,
    { extra: { issues } },
  );
}

type Resolved = { row: ParsedImportRow; sampleId: string; probeLiquidId: string };

/** Each row's sample (id or label, of this batch) and probe liquid (id or unique name), or issues. */
function resolveRows(
  rows: ParsedImportRow[],
  lotCode: string,
  sampleRows: { id: string; label: string }[],
  liquidRows: { id: string; name: string }[],
): { resolved: Resolved[]; issues: ImportIssue[] } {
  const sampleByLabel = new Map(sampleRows.map((s) => [s.label.toLowerCase(), s.id]));
  const sampleIds = new Set(sampleRows.map((s) => s.id));
  const liquidIds = new Set(liquidRows.map((l) => l.id));
  const liquidsByName = new Map<string, string[]>();
  for (const liquid of liquidRows) {
    const key = liquid.name.trim().toLowerCase();
    liquidsByName.set(key, [...(liquidsByName.get(key) ?? []), liquid.id]);
  }
  const issues: ImportIssue[] = [];
  const resolved: Resolved[] = [];
  for (const row of rows) {
    const sampleId = sampleIds.has(row.sample)
      ? row.sample
      : sampleByLabel.get(row.sample.toLowerCase());
    if (!sampleId) {
      issues.push({
        row: row.row,
        column: IMPORT_COLUMNS.sample.header,
        message: `No sample "${row.sample}" in batch ${lotCode}. Add the sample on the batch page first, or correct the label.`,
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
  return { resolved, issues };
}

/**
 * Imports hand-read angles (CSV) into one batch, all or nothing: every row must name a current
 * sample of this batch and a probe liquid of the library or the organization (by id or by name).
 * Each row becomes a drop (source 'import', no photo) with one 'manual' analysis revision, in a
 * single transaction with one audit row; then the batch's out-of-spec verdict is refreshed.
 */
export async function importManualAngles(
  actor: Actor,
  batchId: string,
  csv: string,
): Promise<ImportOutcome> {
  const parsed = parseImportCsv(csv);
  if (!parsed.ok) throw invalidImport(parsed.issues);
  const outcome = await inTransaction(async (tx) => {
    const batch = await lockBatchForImport(tx, actor.organizationId, batchId);
    if (!batch) throw notFound('That batch');
    if (batch.archivedAt) {
      throw new AppError(
        'archived',
        'This batch is archived; results can no longer be added to it.',
      );
    }
    const { resolved, issues } = resolveRows(
      parsed.rows,
      batch.lotCode,
      await lockLiveSamplesOfBatch(tx, batchId),
      await liveProbeLiquidNames(tx, actor.organizationId),
    );
    if (issues.length > 0) throw invalidImport(issues);

    const dropRows: NewDrop[] = [];
    const analysisRows: NewAnalysis[] = [];
    for (const { row, sampleId, probeLiquidId } of resolved) {
      const dropId = newId();
      const meanDeg = (row.leftDeg + row.rightDeg) / 2;
      dropRows.push({
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
      analysisRows.push({
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
    await insertDropsAndAnalyses(tx, dropRows, analysisRows);
    await emitWebhookEvents(
      tx,
      actor.organizationId,
      'analysis.saved',
      analysisRows.map((a, i) => ({
        analysisId: a.id,
        dropId: a.dropId,
        revision: 1,
        sampleId: dropRows[i]!.sampleId,
        probeLiquidId: dropRows[i]!.probeLiquidId,
        photoId: null,
        method: 'manual',
        leftDeg: a.leftDeg,
        rightDeg: a.rightDeg,
        meanDeg: a.meanDeg,
        warnings: [],
        source: 'import',
        savedByUserId: actor.userId,
      })),
    );
    const dropIds = dropRows.map((d) => d.id!);
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
  await refreshBatchVerdictQuietly(actor.organizationId, batchId);
  return outcome;
}
