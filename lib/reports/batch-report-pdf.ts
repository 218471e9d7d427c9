import 'server-only';
import path from 'node:path';
import PDFDocument from 'pdfkit';
import type { BatchLiquidResult, BatchSurfaceEnergy, SpecLine } from '@/lib/compare/types';

/** Everything the certificate of analysis of one batch shows. */
export type BatchReportData = {
  organizationName: string;
  coating: { code: string; name: string; description: string };
  batch: {
    lotCode: string;
    producedOn: string;
    process: Record<string, number | undefined>;
    notes: string;
  };
  specs: { liquidName: string; text: string }[];
  samples: {
    label: string;
    substrate: string;
    position: string;
    treatedAt: Date | null;
    dropCount: number;
  }[];
  liquids: { name: string; result: BatchLiquidResult; specLines: SpecLine[] }[];
  /** The batch's OWRK surface free energy and its verdict, when the comparison has one. */
  surfaceEnergy: {
    result: BatchSurfaceEnergy;
    method: string;
    basis: string;
    coverageFactor: number;
  } | null;
  /** Dynamic wetting of the batch (advancing, receding, hysteresis, roll-off per liquid). */
  dynamic?: { title: string; result: BatchLiquidResult }[];
  representative: { png: Buffer; caption: string } | null;
  review: {
    reviewerName: string;
    signedAt: string;
    digest: string;
    comment: string;
    analysisCount: number;
  } | null;
  /** Whether the certificate is final: approved and signed, a draft, or rejected (stamped on every page). */
  status: CertificateStatus;
  /** The sittings at the instrument behind the batch's drops, per probe liquid. */
  sessions: {
    liquidName: string;
    operatorName: string | null;
    firstMeasuredAt: Date;
    lastMeasuredAt: Date;
    temperatureC: number | null;
    humidityPct: number | null;
    dropVolumeUl: number | null;
    instrumentNotes: string | null;
    liquidLot: string | null;
    dropCount: number;
  }[];
  angleBasis: string;
  methods: { name: string; source: string }[];
  generatedAt: Date;
  generatedBy: string;
  softwareVersion: string;
};

export type CertificateStatus =
  | { kind: 'approved' }
  | { kind: 'draft'; reason: string }
  | { kind: 'rejected'; reviewerName: string; decidedAt: Date | null; comment: string };

/** The stamp an unsigned certificate carries on every page; null for an approved one. */
export function statusStamp(status: CertificateStatus): { title: string; detail: string } | null {
  if (status.kind === 'approved') return null;
  if (status.kind === 'draft') return { title: 'DRAFT — NOT APPROVED', detail: status.reason };
  const when = status.decidedAt ? ` on ${utc(status.decidedAt)}` : '';
  return {
    title: 'REJECTED',
    detail: `Rejected by ${status.reviewerName}${when}: ${status.comment || 'no comment given'}`,
  };
}

/** Fonts shipped in fonts/ (DejaVu Sans: ≥, ≤, °, θ, γ, β, µ, all embedded as PDF/A asks). */
const FONT_DIR = path.join(process.cwd(), 'fonts');
const REGULAR = path.join(FONT_DIR, 'DejaVuSans.ttf');
const BOLD = path.join(FONT_DIR, 'DejaVuSans-Bold.ttf');

const utc = (d: Date) => `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
const day = (d: Date) => d.toISOString().slice(0, 10);

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

const fmt = (value: number | null | undefined, digits = 1) =>
  value === null || value === undefined || !Number.isFinite(value) ? '—' : value.toFixed(digits);

type Outcome = BatchLiquidResult['verdict']['outcome'];
/** A verdict as the tables print it: PASS, FAIL, NO SPEC, … */
const verdictText = (outcome: Outcome) =>
  (outcome === 'no-spec' ? 'no spec' : outcome.replace(/-/g, ' ')).toUpperCase();
const verdictColour = (outcome: Outcome) =>
  outcome === 'pass' ? LEAF : outcome === 'fail' ? CORAL : AMBER;

/** The columns, and the cells, of the statistics of a set of angles: n, mean, SD, 95 % CI. */
const STATISTICS_COLUMNS = [
  { title: 'n', width: 28, align: 'right' },
  { title: 'Mean (°)', width: 50, align: 'right' },
  { title: 'SD (°)', width: 42, align: 'right' },
  { title: '95 % CI (°)', width: 80, align: 'right' },
] as const;
const statisticsCells = (d: BatchLiquidResult['description']) => [
  String(d?.n ?? 0),
  fmt(d?.mean),
  fmt(d?.sd, 2),
  d?.ci ? `${fmt(d.ci.lower)} – ${fmt(d.ci.upper)}` : '—',
];

/**
 * Renders the certificate of analysis as an archival, tagged PDF (PDF/A-2b, A4, embedded DejaVu
 * Sans, vector plots): every text is a structure element (headings H1/H2, paragraphs P), the
 * photo a Figure with its caption as alternative text, rules and plots artifacts.
 */
export function renderBatchReportPdf(data: BatchReportData): Promise<Buffer> {
  const doc = new PDFDocument({
    size: 'A4',
    margins: { top: 64, bottom: 64, left: 56, right: 56 },
    bufferPages: true,
    pdfVersion: '1.7',
    subset: 'PDF/A-2b',
    tagged: true,
    displayTitle: true,
    lang: 'en-GB',
    font: REGULAR,
    info: {
      Title: `Certificate of analysis ${data.coating.code} ${data.batch.lotCode}`,
      Author: data.organizationName,
      Creator: data.softwareVersion,
      CreationDate: data.generatedAt,
      ModDate: data.generatedAt,
    },
  });
  doc.registerFont('Helvetica', REGULAR);
  doc.registerFont('Helvetica-Bold', BOLD);
  doc.font('Helvetica');
  const chunks: Buffer[] = [];
  doc.on('data', (chunk: Buffer) => chunks.push(chunk));
  const finished = new Promise<Buffer>((resolve, reject) => {
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });
  // Every text is tagged: a paragraph of the current section unless told otherwise.
  const root = doc.struct('Document');
  doc.addStructure(root);
  let section = root;
  const rawText = doc.text.bind(doc) as (...args: unknown[]) => PDFKit.PDFDocument;
  type TextOptions = PDFKit.Mixins.TextOptions & { structParent?: unknown; structType?: string };
  (doc as unknown as { text: (...args: unknown[]) => PDFKit.PDFDocument }).text = (
    value: unknown,
    ...rest: unknown[]
  ) => {
    const last =
      rest.length > 0 && typeof rest[rest.length - 1] === 'object' && rest[rest.length - 1] !== null
        ? (rest.pop() as TextOptions)
        : {};
    return rawText(String(value), ...rest, { structParent: section, structType: 'P', ...last });
  };
  /** Lines, boxes and plot marks are decoration: marked as artifacts, outside the structure. */
  const artifact = (draw: () => void) => {
    doc.markContent('Artifact');
    draw();
    doc.endMarkedContent();
  };
  const newSection = (title: string) => {
    section = doc.struct('Sect');
    root.add(section);
    return title;
  };
  const left = doc.page.margins.left;
  const width = doc.page.width - left - doc.page.margins.right;

  const heading = (text: string) => {
    if (doc.y > doc.page.height - 140) doc.addPage();
    newSection(text);
    doc
      .moveDown(0.8)
      .font('Helvetica-Bold')
      .fontSize(12)
      .fillColor(LAGOON)
      .text(text, left, doc.y, { structType: 'H2' });
    artifact(() =>
      doc
        .moveTo(left, doc.y + 2)
        .lineTo(left + width, doc.y + 2)
        .lineWidth(0.5)
        .strokeColor('#cbd3dc')
        .stroke(),
    );
    doc.moveDown(0.5).font('Helvetica').fontSize(9.5).fillColor(INK);
  };
  /** A small muted line: the basis of a table, a note, a rule applied. */
  const note = (text: string) =>
    doc.fontSize(8.5).fillColor(MUTED).text(text, left, doc.y, { width });
  /** A results section: its heading and the basis its figures rest on. */
  const resultsSection = (title: string, basis: string) => {
    heading(title);
    note(basis).fontSize(9.5).fillColor(INK);
    doc.moveDown(0.4);
  };
  const pairs = (rows: [string, string][]) => {
    for (const [label, value] of rows) {
      const y = doc.y;
      doc.font('Helvetica').fillColor(MUTED).text(label, left, y, { width: 160 });
      doc.fillColor(INK).text(value, left + 165, y, { width: width - 165 });
      doc.moveDown(0.15);
    }
  };
  const table = (
    columns: { title: string; width: number; align?: 'left' | 'right' }[],
    rows: string[][],
    colors?: (string | null)[],
  ) => {
    const drawRow = (cells: string[], bold: boolean, color: string) => {
      if (doc.y > doc.page.height - 90) doc.addPage();
      const y = doc.y;
      let x = left;
      let h = 0;
      cells.forEach((cell, i) => {
        const col = columns[i];
        doc
          .font(bold ? 'Helvetica-Bold' : 'Helvetica')
          .fontSize(8.5)
          .fillColor(i === cells.length - 1 ? color : INK);
        const cellHeight = doc.heightOfString(cell, { width: col.width - 4 });
        doc.text(cell, x, y, { width: col.width - 4, align: col.align ?? 'left' });
        h = Math.max(h, cellHeight);
        x += col.width;
      });
      doc.y = y + h + 3;
      artifact(() =>
        doc
          .moveTo(left, doc.y - 1.5)
          .lineTo(left + width, doc.y - 1.5)
          .lineWidth(0.3)
          .strokeColor('#e6eaef')
          .stroke(),
      );
    };
    drawRow(
      columns.map((c) => c.title),
      true,
      INK,
    );
    rows.forEach((r, i) => drawRow(r, false, colors?.[i] ?? INK));
    doc.font('Helvetica').fontSize(9.5).fillColor(INK);
  };

  // Header: Beadline's mark and the title.
  artifact(() => {
    doc.save();
    doc.roundedRect(left, 40, 22, 22, 5).fill('#134f52');
    doc
      .path(
        `M ${left + 4} ${56} C ${left + 4} 47 ${left + 8} 44 ${left + 11} 44 C ${left + 14} 44 ${left + 18} 47 ${left + 18} 56 Z`,
      )
      .fill('#67d5d2');
    doc
      .moveTo(left + 3, 56)
      .lineTo(left + 19, 56)
      .lineWidth(1)
      .strokeColor('#ecfbfa')
      .stroke();
    doc.restore();
  });
  doc
    .font('Helvetica-Bold')
    .fontSize(11)
    .fillColor(LAGOON)
    .text('Beadline', left + 30, 46);
  doc
    .font('Helvetica')
    .fontSize(8.5)
    .fillColor(MUTED)
    .text(data.organizationName, left + 30, 46, { width: width - 30, align: 'right' });
  doc.y = 80;
  doc
    .font('Helvetica-Bold')
    .fontSize(18)
    .fillColor(INK)
    .text('Certificate of analysis', left, doc.y, { structType: 'H1' });
  doc
    .font('Helvetica')
    .fontSize(11)
    .fillColor(MUTED)
    .text(`${data.coating.code} · batch ${data.batch.lotCode}`);
  const stamp = statusStamp(data.status);
  if (stamp) {
    // The status in words on page 1 (the stamp on every page repeats it).
    doc
      .moveDown(0.4)
      .font('Helvetica-Bold')
      .fontSize(11)
      .fillColor(CORAL)
      .text(stamp.title, left, doc.y, { width });
    doc.font('Helvetica').fontSize(9.5).text(stamp.detail, left, doc.y, { width });
    doc.fillColor(INK);
  }

  heading('Coating and batch');
  pairs([
    ['Coating', `${data.coating.code}: ${data.coating.name}`],
    ...(data.coating.description
      ? ([['Description', data.coating.description]] as [string, string][])
      : []),
    ['Batch (lot code)', data.batch.lotCode],
    ['Produced on', data.batch.producedOn],
    ...Object.entries(data.batch.process)
      .filter(([, v]) => v !== undefined)
      .map(([k, v]) => [PROCESS_LABELS[k] ?? k, String(v)] as [string, string]),
    ...(data.batch.notes ? ([['Notes', data.batch.notes]] as [string, string][]) : []),
  ]);

  heading('Specification');
  if (data.specs.length === 0)
    doc.text('No specification is recorded for this coating.', left, doc.y, { width });
  for (const spec of data.specs)
    doc.text(`${spec.liquidName}: ${spec.text}`, left, doc.y, { width });

  heading('Samples');
  table(
    [
      { title: 'Sample', width: 60 },
      { title: 'Substrate', width: 190 },
      { title: 'Position', width: 100 },
      { title: 'Treated', width: 80 },
      { title: 'Drops', width: 50, align: 'right' },
    ],
    data.samples.map((s) => [
      s.label,
      s.substrate || '—',
      s.position || '—',
      s.treatedAt ? s.treatedAt.toISOString().slice(0, 10) : '—',
      String(s.dropCount),
    ]),
  );

  heading('Measurement');
  if (data.sessions.length === 0)
    doc.text('No drops have been measured on this batch.', left, doc.y, { width });
  else {
    const range = (values: (number | null)[], unit: string, digits = 1) => {
      const known = values.filter((v): v is number => v !== null);
      if (known.length === 0) return '—';
      const lo = Math.min(...known);
      const hi = Math.max(...known);
      return lo === hi
        ? `${lo.toFixed(digits)} ${unit}`
        : `${lo.toFixed(digits)}–${hi.toFixed(digits)} ${unit}`;
    };
    table(
      [
        // A lot code is one word: its column holds 16 characters whole (e.g. DIM-LOT-2026-077).
        { title: 'Liquid', width: 58 },
        { title: 'Operator', width: 62 },
        { title: 'Measured (UTC)', width: 90 },
        { title: 'Conditions', width: 86 },
        { title: 'Drop (µL)', width: 34, align: 'right' },
        { title: 'Liquid lot', width: 90 },
        { title: 'Instrument', width: 63 },
      ],
      data.sessions.map((s) => [
        s.liquidName,
        s.operatorName ?? 'not recorded',
        day(s.firstMeasuredAt) === day(s.lastMeasuredAt)
          ? `${day(s.firstMeasuredAt)} ${s.firstMeasuredAt.toISOString().slice(11, 16)}–${s.lastMeasuredAt.toISOString().slice(11, 16)}`
          : `${day(s.firstMeasuredAt)} – ${day(s.lastMeasuredAt)}`,
        `${range([s.temperatureC], '°C')}, ${range([s.humidityPct], '% RH', 0)}`,
        s.dropVolumeUl !== null ? s.dropVolumeUl.toFixed(1) : '—',
        s.liquidLot || 'not recorded',
        s.instrumentNotes || 'not recorded',
      ]),
    );
    const first = data.sessions.reduce(
      (a, s) => (s.firstMeasuredAt < a ? s.firstMeasuredAt : a),
      data.sessions[0].firstMeasuredAt,
    );
    const last = data.sessions.reduce(
      (a, s) => (s.lastMeasuredAt > a ? s.lastMeasuredAt : a),
      data.sessions[0].lastMeasuredAt,
    );
    doc
      .fontSize(8.5)
      .fillColor(MUTED)
      .text(
        `Drops measured from ${utc(first)} to ${utc(last)}. Conditions as recorded for the session: room temperature and relative humidity. Method and software: see Methods.`,
        left,
        doc.y,
        { width },
      );
    doc.fontSize(9.5).fillColor(INK);
  }

  resultsSection(
    'Results per probe liquid',
    `${data.angleBasis} Confidence intervals: Student t, 95 %.`,
  );
  table(
    [
      { title: 'Liquid', width: 80 },
      ...STATISTICS_COLUMNS,
      { title: 'Class', width: 70 },
      { title: 'Verdict', width: 133 },
    ],
    data.liquids.map(({ name, result }) => [
      name,
      ...statisticsCells(result.description),
      result.wettingClass?.label ?? '—',
      verdictText(result.verdict.outcome),
    ]),
    data.liquids.map(({ result }) => verdictColour(result.verdict.outcome)),
  );
  for (const { name, result } of data.liquids) {
    for (const spec of result.verdict.specs)
      note(`${name} — rule applied: ${spec.rule} ${spec.reason}`);
  }
  doc.fontSize(9.5).fillColor(INK);

  if (data.surfaceEnergy) {
    const { result, method, basis, coverageFactor } = data.surfaceEnergy;
    const pm = (v: { value: number; standardUncertainty: number } | null) =>
      v ? `${fmt(v.value)} ± ${fmt(coverageFactor * v.standardUncertainty)}` : '—';
    resultsSection('Surface free energy', `${method}. ${basis}`);
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
          verdictText(result.verdict.outcome),
        ],
      ],
      [verdictColour(result.verdict.outcome)],
    );
    if (!result.total && result.note) note(result.note);
    for (const spec of result.verdict.specs) {
      note(`Surface free energy — rule applied: ${spec.rule}. ${spec.reason}`);
    }
    doc.fontSize(9.5).fillColor(INK);
  }

  if (data.dynamic?.length) {
    resultsSection(
      'Dynamic wetting',
      'Each series (a drop grown and withdrawn, or a tilting plate) counts once with the value of its latest analysis; statistics and verdicts as for the static angles.',
    );
    table(
      [{ title: 'Quantity', width: 150 }, ...STATISTICS_COLUMNS, { title: 'Verdict', width: 133 }],
      data.dynamic.map(({ title, result }) => [
        title,
        ...statisticsCells(result.description),
        verdictText(result.verdict.outcome),
      ]),
      data.dynamic.map(({ result }) => verdictColour(result.verdict.outcome)),
    );
    for (const { title, result } of data.dynamic) {
      for (const spec of result.verdict.specs) {
        note(`${title} — rule applied: ${spec.rule} ${spec.reason}`);
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
    doc.markContent('Artifact');
    doc.rect(plotX, plotY, plotW, plotH).lineWidth(0.5).strokeColor('#cbd3dc').stroke();
    for (let t = Math.ceil(lo); t <= hi; t += Math.max(1, Math.round((hi - lo) / 8))) {
      doc
        .moveTo(x(t), plotY + plotH)
        .lineTo(x(t), plotY + plotH + 3)
        .strokeColor(MUTED)
        .stroke();
    }
    for (const s of specLines) {
      doc
        .moveTo(x(s.value), plotY)
        .lineTo(x(s.value), plotY + plotH)
        .dash(3, { space: 2 })
        .lineWidth(0.8)
        .strokeColor(CORAL)
        .stroke()
        .undash();
    }
    values.forEach((v, i) => {
      doc
        .circle(x(v), plotY + 20 + (i % 5) * 5, 2)
        .fillOpacity(0.8)
        .fill(LAGOON)
        .fillOpacity(1);
    });
    const d = result.description;
    if (d?.ci) {
      const cy = plotY + plotH - 12;
      doc
        .moveTo(x(d.ci.lower), cy)
        .lineTo(x(d.ci.upper), cy)
        .lineWidth(1.2)
        .strokeColor(INK)
        .stroke();
      doc.rect(x(d.mean) - 2.5, cy - 2.5, 5, 5).fill(INK);
    }
    doc.endMarkedContent();
    // The plot's words are text of the figure's section.
    for (let t = Math.ceil(lo); t <= hi; t += Math.max(1, Math.round((hi - lo) / 8))) {
      doc
        .fontSize(7)
        .fillColor(MUTED)
        .text(`${t}°`, x(t) - 10, plotY + plotH + 5, { width: 20, align: 'center' });
    }
    for (const s of specLines) {
      doc
        .fontSize(7)
        .fillColor(CORAL)
        .text(
          `${s.kind} ${s.value}° (${s.scope})`,
          x(s.value) + 2,
          plotY + 2 + (s.scope === 'mean' ? 9 : 0),
        );
    }
    doc
      .fontSize(7)
      .fillColor(MUTED)
      .text('angle (°)', left, plotY + plotH / 2 - 4, { width: 36 });
    doc.y = plotY + plotH + 18;
    doc
      .fontSize(8)
      .fillColor(MUTED)
      .text(
        'Dots: every drop. Black bar: batch mean with its 95 % confidence interval. Dashed: spec limits.',
        left,
        doc.y,
        { width },
      );
    doc.fontSize(9.5).fillColor(INK);
  }

  if (data.representative) {
    if (doc.y > doc.page.height - 300) doc.addPage();
    heading('Representative drop');
    const imageWidth = Math.min(width, 360);
    const png = data.representative.png;
    const imageY = doc.y;
    section.add(
      doc.struct('Figure', { alt: data.representative.caption }, () => {
        doc.image(png, left, imageY, { width: imageWidth });
      }),
    );
    doc.y = imageY;
    doc.y += (imageWidth * 3) / 4 + 6;
    doc.fontSize(8).fillColor(MUTED).text(data.representative.caption, left, doc.y, { width });
    doc.fontSize(9.5).fillColor(INK);
  }

  heading('Methods');
  for (const m of data.methods) doc.text(`${m.name}: ${m.source}`, left, doc.y, { width });
  doc.text(
    `Software: ${data.softwareVersion}. Generated ${utc(data.generatedAt)} by ${data.generatedBy}.`,
    left,
    doc.y,
    { width },
  );

  heading('Review and signature');
  if (data.review) {
    pairs([
      ['Approved and signed by', data.review.reviewerName],
      ['Signed on', `${data.review.signedAt.slice(0, 16).replace('T', ' ')} UTC`],
      [
        'Results covered',
        `${data.review.analysisCount} analyses (digest ${data.review.digest.slice(0, 16)}…)`,
      ],
      ...(data.review.comment ? ([['Comment', data.review.comment]] as [string, string][]) : []),
    ]);
  } else {
    doc
      .fillColor(CORAL)
      .text(`Not signed. ${stamp ? `${stamp.title}: ${stamp.detail}` : ''}`, left, doc.y, { width })
      .fillColor(INK);
  }

  heading('Release of product');
  doc
    .fontSize(8.5)
    .text(
      'Results that release product for safety-relevant uses (medical, food contact, structural bonding) must follow the lab’s validated procedure and the applicable standards; ' +
        'Beadline supports, and does not replace, that procedure and licensed or qualified sign-off.',
      left,
      doc.y,
      { width },
    );

  // Footer on every page.
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.markContent('Artifact', { type: 'Pagination' });
    if (stamp) {
      // A band across the top and a diagonal mark: no page of an unsigned certificate looks final.
      doc.save();
      doc.rect(0, 0, doc.page.width, 36).fill('#ffe0db');
      doc.font('Helvetica-Bold').fontSize(8).fillColor(CORAL);
      rawText(`${stamp.title} · ${stamp.detail}`, left, 7, {
        width,
        align: 'center',
        height: 24,
        ellipsis: true,
      });
      doc.rotate(-35, { origin: [doc.page.width / 2, doc.page.height / 2] });
      doc.fontSize(54).fillOpacity(0.12);
      rawText(stamp.title, 0, doc.page.height / 2 - 30, {
        width: doc.page.width,
        align: 'center',
        lineBreak: false,
      });
      doc.restore();
    }
    doc.font('Helvetica').fontSize(7.5).fillColor(MUTED);
    rawText(
      `${data.coating.code} · ${data.batch.lotCode} · page ${i + 1} of ${range.count}${stamp ? ` · ${stamp.title}` : ''}`,
      left,
      doc.page.height - 40,
      { width, align: 'center' },
    );
    doc.endMarkedContent();
    doc.page.margins.bottom = bottom;
  }
  doc.end();
  return finished;
}
