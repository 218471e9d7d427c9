import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { DropFigure } from '@/components/drops/drop-figure';
import { DropRevisions } from '@/components/drops/drop-revisions';
import { DefinitionList } from '@/components/ui/definition-list';
import { PageHeader } from '@/components/ui/empty-state';
import { fmt, fmtUtc } from '@/components/ui/format';
import type { FitMethod } from '@/lib/analysis/types';
import { requirePage } from '@/lib/auth/guard';
import { can } from '@/lib/auth/permissions';
import { workspaceHref } from '@/lib/measure/links';
import { loadDropPage } from '@/server/drops/load';

export const metadata: Metadata = { title: 'Drop' };

/** One drop: its photo with the fit, where it sits, and every revision with who, when and why. */
export default async function DropPage({ params }: { params: Promise<{ id: string }> }) {
  // Viewers too, for drops whose latest result is approved (loadDropPage applies the rule).
  const ctx = await requirePage('organization:read');
  const { id } = await params;
  const page = await loadDropPage(ctx, id);
  if (!page) notFound();
  const { drop, revisions } = page;
  const latest = revisions[0];
  const canWrite = can(ctx.organization.role, 'records:write');
  // The photo's pixels are served to roles that may read every result.
  const canSeePhoto = can(ctx.organization.role, 'results:read-all');
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={`/batches/${drop.batchId}`} className="text-lagoon-700 hover:underline">
          ← Batch {drop.lotCode}
        </Link>
      </p>
      <PageHeader
        title={`Drop on ${drop.coatingCode} · ${drop.lotCode} / ${drop.sampleLabel}`}
        lead={`${drop.liquidName}, measured ${fmtUtc(drop.measuredAt)}${drop.archivedAt ? ' (archived)' : ''}.`}
      />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <section className="card min-w-0" aria-label="Photo and fit">
          <h2 className="mb-3">{drop.photoName ?? 'Angles read by hand'}</h2>
          {!canSeePhoto ? (
            <p className="text-sm text-ink-600">
              The photo and its fit are shown to the lab&apos;s analysts and reviewers; the
              approved angles are listed here.
            </p>
          ) : drop.photoId && latest && latest.method !== 'manual' ? (
            <DropFigure
              photoId={drop.photoId}
              width={drop.photoWidth ?? 0}
              height={drop.photoHeight ?? 0}
              options={{
                method: latest.method as FitMethod,
                ...(latest.baseline ? { baseline: latest.baseline } : {}),
                ...(latest.scaleUsedPxPerMm ? { scalePxPerMm: latest.scaleUsedPxPerMm } : {}),
                ...(latest.settings ? { settings: latest.settings } : {}),
              }}
              savedLeftDeg={latest.leftDeg}
              savedRightDeg={latest.rightDeg}
            />
          ) : (
            <p className="text-sm text-ink-600">
              This drop was imported as angles read by hand; there is no photo to draw.
            </p>
          )}
          {canWrite && drop.photoId && !drop.archivedAt ? (
            <p className="mt-3">
              <Link className="btn-primary" href={workspaceHref([drop.photoId])}>
                Open in the workspace
              </Link>
              <span className="ml-2 text-xs text-ink-600">
                Keeps this drop&apos;s session conditions unless you change them.
              </span>
            </p>
          ) : null}
        </section>
        <section className="card" aria-label="Latest result">
          <h2 className="mb-3">Latest result</h2>
          {latest ? (
            <DefinitionList
              items={[
                { term: 'Revision', value: `r${latest.revision}`, testId: 'latest-revision' },
                {
                  term: 'Left',
                  value: `${fmt(latest.leftDeg, 1)}° ± ${fmt(latest.leftUncertaintyDeg, 1)}°`,
                },
                {
                  term: 'Right',
                  value: `${fmt(latest.rightDeg, 1)}° ± ${fmt(latest.rightUncertaintyDeg, 1)}°`,
                },
                { term: 'Mean', value: `${fmt(latest.meanDeg, 1)}°` },
                {
                  term: 'Warnings',
                  value: latest.warnings.length
                    ? latest.warnings.map((w) => w.message).join(' ')
                    : 'none',
                },
                { term: 'Review', value: latest.reviewStatus },
                { term: 'Software', value: latest.softwareVersion },
              ]}
            />
          ) : (
            <p className="text-sm text-ink-600">No analysis yet.</p>
          )}
        </section>
      </div>
      <DropRevisions revisions={revisions} />
    </>
  );
}
