import { createHash } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import sharp from 'sharp';
import { UTApi, UTFile } from 'uploadthing/server';
import { renderDrop } from '@/fixtures/generator/render';
import { analyseDrop } from '@/lib/analysis';
import { utapiOptions } from '@/lib/uploads/config';
import type { Database } from './client';
import { DEMO_COATINGS, DEMO_LIQUID_IDS, type DemoDrop } from './demo-scenario';
import { engineAnalysisRow } from './queries/drops';
import { newId } from './queries/ids';
import {
  analyses,
  batches,
  coatings,
  drops,
  measurementSessions,
  photos,
  samples,
  specs,
} from './schema';

const SCALE_PX_PER_MM = 110;
const DAY = 86_400_000;

/** Runs `work` without the upload SDK's deprecation notices about fields this code never reads. */
async function quietly<T>(work: () => Promise<T>): Promise<T> {
  const warn = console.warn;
  console.warn = (...args: unknown[]) => {
    if (typeof args[0] === 'string' && args[0].includes('[uploadthing][deprecated]')) return;
    warn(...args);
  };
  try {
    return await work();
  } finally {
    console.warn = warn;
  }
}

type Owner = {
  organizationId: string;
  analystUserId: string;
  analystName: string;
  adminUserId: string;
};

async function renderPhoto(drop: DemoDrop) {
  const rendered = renderDrop({
    width: 640,
    height: 480,
    contactAngleDeg: drop.renderDeg,
    bond: drop.bond,
    halfWidthPx: drop.renderDeg > 100 ? 120 : 150,
    centerX: 320 + ((drop.seed % 7) - 3) * 4,
    baselineY: 330,
    tiltDeg: ((drop.seed % 5) - 2) * 0.3,
    blurPx: 1,
    noise: 0.012,
    needle: null,
    supersample: 2,
    seed: drop.seed,
  });
  const { image } = rendered;
  const png = await sharp(
    Buffer.from(image.data.buffer, image.data.byteOffset, image.data.byteLength),
    {
      raw: { width: image.width, height: image.height, channels: 1 },
    },
  )
    .png()
    .toBuffer();
  const thumbnail = await sharp(png).resize({ width: 320 }).png().toBuffer();
  return { image, png, thumbnail };
}

/**
 * Coatings, specs, batches, samples, sessions and drops of the demo scenario. Each drop photo is
 * rendered from the Young–Laplace profile, stored through the upload service like any upload,
 * and analysed by lib/analysis, so every number shown comes from the engine.
 */
export async function seedDemoRecords(
  db: Database,
  owner: Owner,
  log: (line: string) => void,
): Promise<void> {
  const utapi = new UTApi(utapiOptions());
  let dropCount = 0;
  for (const coating of DEMO_COATINGS) {
    const [present] = await db
      .select({ id: coatings.id })
      .from(coatings)
      .where(
        and(eq(coatings.organizationId, owner.organizationId), eq(coatings.code, coating.code)),
      );
    if (present) continue;
    // One transaction per coating: a failed seed leaves no half-made coating behind.
    await db.transaction(async (db) => {
      const coatingId = newId();
      await db.insert(coatings).values({
        id: coatingId,
        organizationId: owner.organizationId,
        code: coating.code,
        name: coating.name,
        description: coating.description,
        createdByUserId: owner.adminUserId,
      });
      for (const spec of coating.specs) {
        await db.insert(specs).values({
          id: newId(),
          organizationId: owner.organizationId,
          coatingId,
          probeLiquidId: DEMO_LIQUID_IDS[spec.liquid],
          minDeg: spec.minDeg ?? null,
          maxDeg: spec.maxDeg ?? null,
          scope: spec.scope,
          minSurfaceEnergyMnM: spec.minSurfaceEnergyMnM ?? null,
          maxDaysSinceTreatment: spec.maxDaysSinceTreatment ?? null,
          note: spec.note,
        });
      }
      for (const batch of coating.batches) {
        const batchId = newId();
        const produced = new Date(`${batch.producedOn}T08:00:00Z`);
        await db.insert(batches).values({
          id: batchId,
          organizationId: owner.organizationId,
          coatingId,
          lotCode: batch.lotCode,
          producedOn: batch.producedOn,
          process: batch.process,
          notes: batch.notes,
          createdByUserId: owner.analystUserId,
        });
        for (const sample of batch.samples) {
          const sampleId = newId();
          await db.insert(samples).values({
            id: sampleId,
            organizationId: owner.organizationId,
            batchId,
            label: sample.label,
            substrate: sample.substrate,
            position: sample.position,
            treatedAt: sample.ageDays === null ? null : produced,
            createdByUserId: owner.analystUserId,
          });
          const measuredAt = new Date(
            produced.getTime() + (sample.ageDays ?? 2) * DAY + 2 * 3_600_000,
          );
          const sessionIds = new Map<string, string>();
          for (const drop of sample.drops) {
            const liquidId = DEMO_LIQUID_IDS[drop.liquid];
            let sessionId = sessionIds.get(liquidId);
            if (!sessionId) {
              sessionId = newId();
              sessionIds.set(liquidId, sessionId);
              await db.insert(measurementSessions).values({
                id: sessionId,
                organizationId: owner.organizationId,
                operatorName: owner.analystName,
                measuredAt,
                probeLiquidId: liquidId,
                temperatureC: 22.5,
                humidityPct: 46,
                dropVolumeUl: drop.liquid === 'water' ? 3 : 2,
                scalePxPerMm: SCALE_PX_PER_MM,
                instrumentNotes: 'Demo session (photos rendered synthetically).',
                liquidLot: `${drop.liquid.toUpperCase().slice(0, 3)}-2026-01`,
                createdByUserId: owner.analystUserId,
              });
            }
            const { image, png, thumbnail } = await renderPhoto(drop);
            const name = `${coating.code}_${batch.lotCode}_${sample.label}_${drop.liquid}_${drop.seed}.png`;
            const [uploaded] = await quietly(() =>
              utapi.uploadFiles([new UTFile([new Uint8Array(png)], name, { type: 'image/png' })]),
            );
            if (!uploaded?.data) {
              throw new Error(
                `Could not store demo photo ${name}: ${uploaded?.error?.message ?? 'no answer'}`,
              );
            }
            const result = await analyseDrop(image, {
              method: 'young-laplace',
              scalePxPerMm: SCALE_PX_PER_MM,
            });
            const photoId = newId();
            const dropId = newId();
            const { edgePoints: _edgePoints, profile: _profile, ...kept } = result;
            {
              const tx = db;
              await tx.insert(photos).values({
                id: photoId,
                organizationId: owner.organizationId,
                uploadedByUserId: owner.analystUserId,
                fileKey: uploaded.data.key,
                url: uploaded.data.ufsUrl,
                originalName: name,
                sizeBytes: png.length,
                format: 'png',
                width: image.width,
                height: image.height,
                bitDepth: 8,
                sha256: createHash('sha256').update(png).digest('hex'),
                thumbnailPng: thumbnail,
                workingPng: null,
                createdAt: measuredAt,
              });
              await tx.insert(drops).values({
                id: dropId,
                organizationId: owner.organizationId,
                sampleId,
                probeLiquidId: liquidId,
                sessionId,
                photoId,
                source: 'photo',
                measuredAt,
                createdByUserId: owner.analystUserId,
              });
              await tx.insert(analyses).values(
                engineAnalysisRow({
                  id: newId(),
                  organizationId: owner.organizationId,
                  dropId,
                  revision: 1,
                  method: 'young-laplace',
                  baseline: null,
                  options: { scalePxPerMm: SCALE_PX_PER_MM, baselineSource: result.baselineSource },
                  result: kept,
                  createdByUserId: owner.analystUserId,
                  createdAt: measuredAt,
                }),
              );
            }
            dropCount++;
            if (dropCount % 20 === 0)
              log(`[db] demo: ${dropCount} drop photos rendered and analysed`);
          }
        }
      }
    });
  }
  log(`[db] demo: ${dropCount} drop photos rendered and analysed`);
}
