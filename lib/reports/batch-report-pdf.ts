import 'server-only';
import PDFDocument from 'pdfkit';
import type { BatchLiquidResult, BatchSurfaceEnergy, SpecLine } from '@/lib/compare/types';

/** Everything the certificate of analysis of one batch shows. */
export type BatchReportData = {
  organizationName: string;
  coating: { code: string; name: string; description: string };
  batch: { lotCode: string; producedOn: string; process: Record<string, number | undefined>; notes: string };
  specs: { liquidName: string; text: string }[];
  samples: { label: string; substrate: string; position: string; treatedAt: Date | null; dropCount: number }[];
  liquids: { name: string; hazardNote: string | null; result: BatchLiquidResult; specLines: SpecLine[] }[];
  /** The batch's OWRK surface free energy and its verdict, when the comparison has one. */
  surfaceEnergy: { result: BatchSurfaceEnergy; method: string; basis: string; coverageFactor: number } | null;
  /** Dynamic wetting of the batch (advancing, receding, hysteresis, roll-off per liquid). */
  dynamic?: { title: string; result: BatchLiquidResult }[];
  representative: { png: Buffer; caption: string } | null;
  review: { reviewerName: string; signedAt: string; digest: string; comment: string; analysisCount: number } | null;
  angleBasis: string;
  methods: { name: string; source: string }[];
  generatedAt: Date;
  generatedBy: string;
  softwareVersion: string;
};

const INK = '#18202c';
const MUTED = '#55667d';
const LAGOON = '#116467';
const CORAL = '#b32f1d';
const LEAF = '#1f7342';
const AMBER = '#9a5206';

const PROCESS_LABELS: Record<string, string> = {
  cureTemperatureC: 'Cure temperature (°C)',
  cureTimeMin: 'Cure time (min)',
  lineSpeedMPerMin: 'Line speed (m/min)',
  plasmaDoseWMinPerM2: 'Plasma dose (W·min/m²)',
  coatWeightGPerM2: 'Coat weight (g/m²)',
};

const WIN_ANSI_SPELLING: [RegExp, string][] = [
  [/≤/g, '<='],
  [/≥/g, '>='],
  [/−/g, '-'],
  [/θ/g, 'theta'],
  [/β/g, 'beta'],
  [/γ/g, 'gamma'],
  [/³/g, '3'],
];

export function winAnsi(text: string): string {
  return WIN_ANSI_SPELLING.reduce((acc, [pattern, replacement]) => acc.replace(pattern, replacement), text);
}

const fmt = (value: number | null | undefined, digits = 1) =>
  value === null || value === undefined || !Number.isFinite(value) ? '—' : value.toFixed(digits);

/** Renders the certificate of analysis as a PDF (A4, Helvetica, vector plots). */
export function renderBatchReportPdf(data: BatchReportData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: 56, bottom: 64, left: 56, right: 56 },
    bufferPages: true,
    info: {
      Title: `Certificate of analysis ${data.coating.code} ${data.batch.lotCode}`,
      Author: data.organizationName,
      Creator: data.softwareVersion,
    },
  });
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  // The standard PDF fonts cover WinAnsi only; spell out the few symbols outside it.
  const rawText = doc.text.bind(doc) as (...args: unknown[]) => PDFKit.PDFDocument;
  (doc as unknown as { text: (...args: unknown[]) => PDFKit.PDFDocument }).text = (value: unknown, ...rest: unknown[]) =>
    rawText(winAnsi(String(value)), ...rest);
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;

  const heading = (text: string) => {
    if (doc.y > doc.page.height - 140) doc.addPage();
    doc.moveDown(0.8).font('Helvetica-Bold').fontSize(12).fillColor(LAGOON).text(text, left, doc.y);
    doc.moveTo(left, doc.y + 2).lineTo(left + width, doc.y + 2).lineWidth(0.5).strokeColor('#cbd3dc').stroke();
    doc.moveDown(0.5).font('Helvetica').fontSize(9.5).fillColor(INK);
  };
  const pairs = (rows: [string, string][]) => {
    for (const [label, value] of rows) {
      const y = doc.y;
      doc.font('Helvetica').fillColor(MUTED).text(label, left, y, { width: 160 });
      doc.fillColor(INK).text(value, left + 165, y, { width: width - 165 });
      doc.moveDown(0.15);
    }
  };
  const table = (columns: { title: string; width: number; align?: 'left' | 'right' }[], rows: string[][], colors?: (string | null)[]) => {
    const drawRow = (cells: string[], bold: boolean, color: string) => {
      if (doc.y > doc.page.height - 90) doc.addPage();
      const y = doc.y;
      let x = left;
      let h = 0;
      cells.forEach((cell, i) => {
        const col = columns[i];
        doc.font(bold ? 'Helvetica-Bold' : 'Helvetica').fontSize(8.5).fillColor(i === cells.length - 1 ? color : INK);
        const cellHeight = doc.heightOfString(cell, { width: col.width - 4 });
        doc.text(cell, x, y, { width: col.width - 4, align: col.align ?? 'left' });
        h = Math.max(h, cellHeight);
        x += col.width;
      });
      doc.y = y + h + 3;
      doc.moveTo(left, doc.y - 1.5).lineTo(left + width, doc.y - 1.5).lineWidth(0.3).strokeColor('#e6eaef').stroke();
    };
    drawRow(columns.map((c) => c.title), true, INK);
    rows.forEach((r, i) => drawRow(r, false, colors?.[i] ?? INK));
    doc.font('Helvetica').fontSize(9.5).fillColor(INK);
  };

  // Header: Beadline's mark and the title.
  doc.save();
  doc.roundedRect(left, 40, 22, 22, 5).fill('#134f52');
  doc.path(`M ${left + 4} ${56} C ${left + 4} 47 ${left + 8} 44 ${left + 11} 44 C ${left + 14} 44 ${left + 18} 47 ${left + 18} 56 Z`).fill('#67d5d2');
  doc.moveTo(left + 3, 56).lineTo(left + 19, 56).lineWidth(1).strokeColor('#ecfbfa').stroke();
  doc.restore();
  doc.font('Helvetica-Bold').fontSize(11).fillColor(LAGOON).text('Beadline', left + 30, 46);
  doc.font('Helvetica').fontSize(8.5).fillColor(MUTED).text(data.organizationName, left + 30, 46, { width: width - 30, align: 'right' });
  doc.y = 80;
  doc.font('Helvetica-Bold').fontSize(18).fillColor(INK).text('Certificate of analysis', left, doc.y);
  doc.font('Helvetica').fontSize(11).fillColor(MUTED).text(`${data.coating.code} · batch ${data.batch.lotCode}`);

  heading('Coating and batch');
  pairs([
    ['Coating', `${data.coating.code}: ${data.coating.name}`],
    ...(data.coating.description ? ([['Description', data.coating.description]] as [string, string][]) : []),
    ['Batch (lot code)', data.batch.lotCode],
    ['Produced on', data.batch.producedOn],
    ...Object.entries(data.batch.process)
      .filter(([, v]) => v !== undefined)
      .map(([k, v]) => [PROCESS_LABELS[k] ?? k, String(v)] as [string, string]),
    ...(data.batch.notes ? ([['Notes', data.batch.notes]] as [string, string][]) : []),
  ]);

  heading('Specification');
  if (data.specs.length === 0) doc.text('No specification is recorded for this coating.', left, doc.y, { width });
  for (const spec of data.specs) doc.text(`${spec.liquidName}: ${spec.text}`, left, doc.y, { width });

  heading('Samples');
  table(
    [
      { title: 'Sample', width: 60 },
      { title: 'Substrate', width: 190 },
      { title: 'Position', width: 100 },
      { title: 'Treated', width: 80 },
      { title: 'Drops', width: 50, align: 'right' },
    ],
    data.samples.map((s) => [s.label, s.substrate || '—', s.position || '—', s.treatedAt ? s.treatedAt.toISOString().slice(0, 10) : '—', String(s.dropCount)]),
  );

  heading('Results per probe liquid');
  doc.fontSize(8.5).fillColor(MUTED).text(`${data.angleBasis} Confidence intervals: Student t, 95 %.`, left, doc.y, { width }).fontSize(9.5).fillColor(INK);
  doc.moveDown(0.4);
  table(
    [
      { title: 'Liquid', width: 80 },
      { title: 'n', width: 28, align: 'right' },
      { title: 'Mean (°)', width: 50, align: 'right' },
      { title: 'SD (°)', width: 42, align: 'right' },
      { title: '95 % CI (°)', width: 80, align: 'right' },
      { title: 'Class', width: 70 },
      { title: 'Verdict', width: 133 },
    ],
    data.liquids.map(({ name, result }) => {
      const d = result.description;
      const verdict = result.verdict.outcome === 'no-spec' ? 'no spec' : result.verdict.outcome.replace(/-/g, ' ');
      return [
        name,
        String(d?.n ?? 0),
        fmt(d?.mean),
        fmt(d?.sd, 2),
        d?.ci ? `${fmt(d.ci.lower)} – ${fmt(d.ci.upper)}` : '—',
        result.wettingClass?.label ?? '—',
        verdict.toUpperCase(),
      ];
    }),
    data.liquids.map(({ result }) =>
      result.verdict.outcome === 'pass' ? LEAF : result.verdict.outcome === 'fail' ? CORAL : AMBER,
    ),
  );
  for (const { name, result, hazardNote } of data.liquids) {
    for (const spec of result.verdict.specs) {
      doc.fontSize(8.5).fillColor(MUTED).text(`${name} — rule applied: ${spec.rule} ${spec.reason}`, left, doc.y, { width });
    }
    if (hazardNote) doc.fillColor(AMBER).text(`${name}: ${hazardNote}`, left, doc.y, { width });
  }
  doc.fontSize(9.5).fillColor(INK);

  if (data.surfaceEnergy) {
    const { result, method, basis, coverageFactor } = data.surfaceEnergy;
    const pm = (v: { value: number; standardUncertainty: number } | null) =>
      v ? `${fmt(v.value)} ± ${fmt(coverageFactor * v.standardUncertainty)}` : '—';
    heading('Surface free energy');
    doc.fontSize(8.5).fillColor(MUTED).text(`${method}. ${basis}`, left, doc.y, { width }).fontSize(9.5).fillColor(INK);
    doc.moveDown(0.4);
    const outcome = result.verdict.outcome === 'no-spec' ? 'no spec' : result.verdict.outcome.replace(/-/g, ' ');
    table(
      [
        { title: 'Liquids (n)', width: 150 },
        { title: 'Total (mN/m)', width: 80, align: 'right' },
        { title: 'Dispersive', width: 75, align: 'right' },
        { title: 'Polar', width: 75, align: 'right' },
        { title: 'Verdict', width: 103 },
      ],
      [
        [
          result.liquids.map((l) => `${l.name} (${l.n})`).join(', ') || '—',
          pm(result.total),
          pm(result.dispersive),
          pm(result.polar),
          outcome.toUpperCase(),
        ],
      ],
      [result.verdict.outcome === 'pass' ? LEAF : result.verdict.outcome === 'fail' ? CORAL : AMBER],
    );
    if (!result.total && result.note) doc.fontSize(8.5).fillColor(MUTED).text(result.note, left, doc.y, { width });
    for (const spec of result.verdict.specs) {
      doc.fontSize(8.5).fillColor(MUTED).text(`Surface free energy — rule applied: ${spec.rule}. ${spec.reason}`, left, doc.y, { width });
    }
    doc.fontSize(9.5).fillColor(INK);
  }

  if (data.dynamic?.length) {
    heading('Dynamic wetting');
    doc.fontSize(8.5).fillColor(MUTED).text('Each series (a drop grown and withdrawn, or a tilting plate) counts once with the value of its latest analysis; statistics and verdicts as for the static angles.', left, doc.y, { width }).fontSize(9.5).fillColor(INK);
    doc.moveDown(0.4);
    const verdictOf = (r: BatchLiquidResult) => (r.verdict.outcome === 'no-spec' ? 'no spec' : r.verdict.outcome.replace(/-/g, ' '));
    table(
      [
        { title: 'Quantity', width: 150 },
        { title: 'n', width: 28, align: 'right' },
        { title: 'Mean (°)', width: 50, align: 'right' },
        { title: 'SD (°)', width: 42, align: 'right' },
        { title: '95 % CI (°)', width: 80, align: 'right' },
        { title: 'Verdict', width: 133 },
      ],
      data.dynamic.map(({ title, result }) => {
        const d = result.description;
        return [title, String(d?.n ?? 0), fmt(d?.mean), fmt(d?.sd, 2), d?.ci ? `${fmt(d.ci.lower)} – ${fmt(d.ci.upper)}` : '—', verdictOf(result).toUpperCase()];
      }),
      data.dynamic.map(({ result }) => (result.verdict.outcome === 'pass' ? LEAF : result.verdict.outcome === 'fail' ? CORAL : AMBER)),
    );
    for (const { title, result } of data.dynamic) {
      for (const spec of result.verdict.specs) {
        doc.fontSize(8.5).fillColor(MUTED).text(`${title} — rule applied: ${spec.rule} ${spec.reason}`, left, doc.y, { width });
      }
    }
    doc.fontSize(9.5).fillColor(INK);
  }

  // Strip plot per liquid: every drop, the mean and its CI, and the spec limits.
  for (const { name, result, specLines } of data.liquids) {
    const values = result.drops.map((d) => d.meanDeg);
    if (values.length === 0) continue;
    if (doc.y > doc.page.height - 170) doc.addPage();
    heading(`Drops of ${name}`);
    const limits = specLines.map((s) => s.value);
    const lo = Math.floor(Math.min(...values, ...limits) - 2);
    const hi = Math.ceil(Math.max(...values, ...limits) + 2);
    const plotX = left + 40;
    const plotW = width - 60;
    const plotY = doc.y + 4;
    const plotH = 60;
    const x = (v: number) => plotX + ((v - lo) / (hi - lo || 1)) * plotW;
    doc.rect(plotX, plotY, plotW, plotH).lineWidth(0.5).strokeColor('#cbd3dc').stroke();
    for (let t = Math.ceil(lo); t <= hi; t += Math.max(1, Math.round((hi - lo) / 8))) {
      doc.moveTo(x(t), plotY + plotH).lineTo(x(t), plotY + plotH + 3).strokeColor(MUTED).stroke();
      doc.fontSize(7).fillColor(MUTED).text(`${t}°`, x(t) - 10, plotY + plotH + 5, { width: 20, align: 'center' });
    }
    for (const s of specLines) {
      doc.moveTo(x(s.value), plotY).lineTo(x(s.value), plotY + plotH).dash(3, { space: 2 }).lineWidth(0.8).strokeColor(CORAL).stroke().undash();
      doc.fontSize(7).fillColor(CORAL).text(`${s.kind} ${s.value}° (${s.scope})`, x(s.value) + 2, plotY + 2 + (s.scope === 'mean' ? 9 : 0));
    }
    values.forEach((v, i) => {
      doc.circle(x(v), plotY + 20 + (i % 5) * 5, 2).fillOpacity(0.8).fill(LAGOON).fillOpacity(1);
    });
    const d = result.description;
    if (d?.ci) {
      const cy = plotY + plotH - 12;
      doc.moveTo(x(d.ci.lower), cy).lineTo(x(d.ci.upper), cy).lineWidth(1.2).strokeColor(INK).stroke();
      doc.rect(x(d.mean) - 2.5, cy - 2.5, 5, 5).fill(INK);
    }
    doc.fontSize(7).fillColor(MUTED).text('angle (°)', left, plotY + plotH / 2 - 4, { width: 36 });
    doc.y = plotY + plotH + 18;
    doc.fontSize(8).fillColor(MUTED).text('Dots: every drop. Black bar: batch mean with its 95 % confidence interval. Dashed: spec limits.', left, doc.y, { width });
    doc.fontSize(9.5).fillColor(INK);
  }

  if (data.representative) {
    if (doc.y > doc.page.height - 300) doc.addPage();
    heading('Representative drop');
    const imageWidth = Math.min(width, 360);
    doc.image(data.representative.png, left, doc.y, { width: imageWidth });
    doc.y += (imageWidth * 3) / 4 + 6;
    doc.fontSize(8).fillColor(MUTED).text(data.representative.caption, left, doc.y, { width });
    doc.fontSize(9.5).fillColor(INK);
  }

  heading('Methods');
  for (const m of data.methods) doc.text(`${m.name}: ${m.source}`, left, doc.y, { width });
  doc.text(`Software: ${data.softwareVersion}. Generated ${data.generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by ${data.generatedBy}.`, { width });

  heading('Review and signature');
  if (data.review) {
    pairs([
      ['Approved and signed by', data.review.reviewerName],
      ['Signed on', `${data.review.signedAt.slice(0, 16).replace('T', ' ')} UTC`],
      ['Results covered', `${data.review.analysisCount} analyses (digest ${data.review.digest.slice(0, 16)}…)`],
      ...(data.review.comment ? ([['Comment', data.review.comment]] as [string, string][]) : []),
    ]);
  } else {
    doc.fillColor(AMBER).text('Not signed: these results have not been approved by a reviewer. This report is a draft.', { width }).fillColor(INK);
  }

  heading('Cautions');
  doc.fontSize(8.5).text(
    'Diiodomethane, formamide and ethylene glycol are harmful: handle probe liquids per the supplier’s safety data sheet, with the lab’s protective equipment and ventilation. ' +
      'Results that release product for safety-relevant uses (medical, food contact, structural bonding) must follow the lab’s validated procedure and the applicable standards; ' +
      'Beadline supports, and does not replace, that procedure and licensed or qualified sign-off.',
    { width },
  );

  // Footer on every page.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.fontSize(7.5).fillColor(MUTED).text(
      `${data.coating.code} · ${data.batch.lotCode} · page ${i + 1} of ${range.count}`,
      left,
      doc.page.height - 40,
      { width, align: 'center' },
    );
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return finished;
}
