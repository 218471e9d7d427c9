import { and, eq } from 'drizzle-orm';
import { getDocument } from 'pdfjs-dist/legacy/build/pdf.mjs';
import { afterAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { DEMO_ORGANIZATION, DEMO_USERS } from '@/db/demo';
import { loadComparison } from '@/db/queries/comparison';
import { batches, memberships, organizations, users } from '@/db/schema';
import type { OrgContext } from '@/lib/auth/context';
import { buildComparison } from '@/lib/compare';
import { buildBatchReport } from '@/server/reports/batch-report';

afterAll(async () => {
  await closeDb();
});

async function pdfText(bytes: Buffer): Promise<{ pages: number; text: string }> {
  const pdf = await getDocument({ data: new Uint8Array(bytes), verbosity: 0 }).promise;
  const parts: string[] = [];
  for (let i = 1; i <= pdf.numPages; i++) {
    const content = await (await pdf.getPage(i)).getTextContent();
    parts.push(content.items.map((item) => ('str' in item ? item.str : '')).join(' '));
  }
  return { pages: pdf.numPages, text: parts.join('\n').replace(/\s+/g, ' ') };
}

// The demo organization is seeded by scripts/test.sh before the tests run.
describe.skipIf(!process.env.UPLOAD_FAKE_URL)('certificate of analysis (PDF)', () => {
  it('is a valid PDF whose text holds the batch numbers the compare page shows', async () => {
    const db = getDb();
    const [org] = await db.select().from(organizations).where(eq(organizations.slug, DEMO_ORGANIZATION.slug));
    const [analyst] = await db
      .select({ id: users.id, email: users.email, name: users.name })
      .from(users)
      .innerJoin(memberships, eq(memberships.userId, users.id))
      .where(and(eq(users.email, DEMO_USERS[1].email), eq(memberships.organizationId, org.id)));
    const [batch] = await db
      .select()
      .from(batches)
      .where(and(eq(batches.organizationId, org.id), eq(batches.lotCode, 'B-0412')));
    const ctx: OrgContext = {
      user: analyst,
      sessionId: 'test',
      organization: { id: org.id, name: org.name, role: 'analyst' },
      memberships: [],
    };
    const { pdf, fileName } = await buildBatchReport(ctx, batch.id);
    expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
    expect(fileName).toBe('certificate-HT-200-B-0412.pdf');
    const { pages, text } = await pdfText(pdf);
    expect(pages).toBeGreaterThanOrEqual(1);

    // The same numbers as the compare page, which builds them with lib/compare the same way.
    const loaded = await loadComparison(org.id, batch.coatingId, { batches: [batch.id], visibility: 'all' });
    const comparison = buildComparison(loaded);
    const water = comparison.liquids.find((l) => l.liquid.id === 'liquid-water')!;
    const result = water.batches.find((b) => b.batch.id === batch.id)!;
    expect(text).toContain('Certificate of analysis');
    expect(text).toContain('B-0412');
    expect(text).toContain(result.description!.mean.toFixed(1));
    expect(text).toContain(result.description!.sd!.toFixed(2));
    expect(text).toContain(`${result.description!.ci!.lower.toFixed(1)} – ${result.description!.ci!.upper.toFixed(1)}`);
    expect(text).toContain(result.verdict.outcome.replace(/-/g, ' ').toUpperCase());
    expect(text).toContain('Bashforth');
    expect(text).toContain('Representative drop');
    expect(text).toContain('Not signed');
    expect(text).toMatch(/validated procedure/);
  });

  it('shows a PP-Print batch’s surface free energy and its verdict as the compare page does', async () => {
    const db = getDb();
    const [org] = await db.select().from(organizations).where(eq(organizations.slug, DEMO_ORGANIZATION.slug));
    const [batch] = await db
      .select()
      .from(batches)
      .where(and(eq(batches.organizationId, org.id), eq(batches.lotCode, 'F-2611')));
    const ctx: OrgContext = {
      user: { id: 'test', email: 'report@example.test', name: 'Report test' },
      sessionId: 'test',
      organization: { id: org.id, name: org.name, role: 'reviewer' },
      memberships: [],
    };
    const { text } = await pdfText((await buildBatchReport(ctx, batch.id)).pdf);
    const loaded = await loadComparison(org.id, batch.coatingId, { batches: [batch.id], visibility: 'all' });
    const se = buildComparison(loaded).surfaceEnergy!;
    const row = se.batches[0];
    expect(text).toContain('Surface free energy');
    expect(text).toContain(
      `${row.total!.value.toFixed(1)} ± ${(se.coverageFactor * row.total!.standardUncertainty).toFixed(1)}`,
    );
    expect(text).toContain('surface free energy (OWRK) at least 38 mN/m');
    expect(row.verdict.outcome).toBe('pass');
  });
});
