import path from 'node:path';
import PDFDocument from 'pdfkit';
import type { StoredSampling } from '../../shared/schemas/receiving';

export interface LotReportData {
  generatedAt: Date;
  generatedBy: string;
  lot: {
    ref: number;
    supplierLotNumber: string;
    poNumber: string | null;
    quantity: number;
    heatNumbers: string[];
    packaging: string;
    certificate: string | null;
    status: string;
    receivedAt: Date;
    receivedBy: string | null;
    decision: 'accept' | 'reject' | null;
    decisionComment: string | null;
    nonconformingCount: number | null;
    decidedAt: Date | null;
    decidedBy: string | null;
  };
  supplier: { code: string; name: string };
  part: { number: string; revision: string; description: string; construction: string; steelGrade: string };
  plan: { revision: number; status: string; activatedAt: Date | null };
  sampling: StoredSampling;
  characteristics: { code: string; name: string; kind: string; unit: string | null; lsl: number | null; nominal: number | null; usl: number | null; severity: string }[];
  cores: number[];
  readings: { serial: number; code: string; value: number | null; pass: boolean | null; conforming: boolean | null; gaugeId: string | null; gaugeAssetTag: string | null; gaugeDueOn: string | null }[];
  photos: { image: Buffer | null; caption: string | null }[];
  morePhotos: number;
  ncrs: { number: string; status: string; title: string }[];
  scars: { number: string; status: string }[];
  audit: { id: number; at: Date; action: string; actor: string | null; hash: string }[];
}

/** The product's shipped font, as TrueType: pdfkit cannot embed WOFF2. */
const FONT_DIR = path.join(path.dirname(require.resolve('open-sans-fonts/package.json')), 'open-sans');
const FONTS = {
  regular: path.join(FONT_DIR, 'Regular/OpenSans-Regular.ttf'),
  semibold: path.join(FONT_DIR, 'Semibold/OpenSans-Semibold.ttf'),
  bold: path.join(FONT_DIR, 'Bold/OpenSans-Bold.ttf'),
};

export const REPORT_TITLE = 'Yokeline — Lot inspection report';

const INK = '#1d2726';
const MUTED = '#56625f';
const TEAL = '#0c3d39';
const RULE = '#c9d6d3';
const ZEBRA = '#f1f6f5';
const BAD = '#b3261e';
const GOOD = '#1d7a3e';

const M = { top: 64, bottom: 56, left: 48, right: 48 };

export const utc = (d: Date | null | undefined): string => (d ? `${d.toISOString().slice(0, 16).replace('T', ' ')} UTC` : '—');
/** Numbers as measured: no float noise, at most 4 decimals. */
export const num = (v: number | null | undefined): string => (v == null ? '—' : String(Number(v.toFixed(4))));

interface Col {
  header: string;
  width: number;
  align?: 'left' | 'right' | 'center';
}
interface Cell {
  text: string;
  colour?: string;
  bold?: boolean;
}

type Doc = PDFKit.PDFDocument;

class Report {
  readonly doc: Doc;
  private readonly width: number;

  constructor(private readonly d: LotReportData) {
    this.doc = new PDFDocument({
      size: 'A4',
      margins: M,
      bufferPages: true,
      font: FONTS.regular,
      info: { Title: `${REPORT_TITLE} — lot ${d.lot.ref}`, Author: 'Yokeline', Subject: `Lot ${d.lot.ref}, ${d.part.number} rev ${d.part.revision}`, Creator: 'Yokeline' },
    });
    this.doc.registerFont('regular', FONTS.regular);
    this.doc.registerFont('semibold', FONTS.semibold);
    this.doc.registerFont('bold', FONTS.bold);
    this.width = this.doc.page.width - M.left - M.right;
  }

  private get bottom(): number {
    return this.doc.page.height - M.bottom;
  }

  ensure(h: number): void {
    if (this.doc.y + h > this.bottom) this.doc.addPage();
  }

  heading(text: string): void {
    // A heading never ends a page alone: room for it, a caption, a table header and rows.
    this.ensure(100);
    this.doc.moveDown(0.8);
    this.doc.font('bold').fontSize(12).fillColor(TEAL).text(text, M.left, this.doc.y, { width: this.width });
    const y = this.doc.y + 2;
    this.doc.moveTo(M.left, y).lineTo(M.left + this.width, y).lineWidth(0.6).strokeColor(RULE).stroke();
    this.doc.y = y + 6;
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  para(text: string, opts: { colour?: string; font?: 'regular' | 'semibold' | 'bold'; size?: number } = {}): void {
    this.doc.font(opts.font ?? 'regular').fontSize(opts.size ?? 9).fillColor(opts.colour ?? INK);
    this.ensure(this.doc.heightOfString(text, { width: this.width }) + 2);
    this.doc.text(text, M.left, this.doc.y, { width: this.width });
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  /** Label / value pairs in two columns of pairs. */
  facts(pairs: [string, string][]): void {
    const colW = this.width / 2;
    const labelW = 92;
    for (let i = 0; i < pairs.length; i += 2) {
      const row = pairs.slice(i, i + 2);
      this.doc.fontSize(9);
      const h = Math.max(...row.map(([, v]) => this.doc.font('regular').heightOfString(v || '—', { width: colW - labelW - 8 }))) + 4;
      this.ensure(h);
      const y = this.doc.y;
      row.forEach(([k, v], j) => {
        const x = M.left + j * colW;
        this.doc.font('semibold').fillColor(MUTED).text(k, x, y, { width: labelW - 4 });
        this.doc.font('regular').fillColor(INK).text(v || '—', x + labelW, y, { width: colW - labelW - 8 });
      });
      this.doc.y = y + h;
    }
  }

  /** A table that breaks across pages and repeats its header row. */
  table(cols: Col[], rows: Cell[][], caption?: string): void {
    const pad = 3;
    const drawHeader = () => {
      const h = Math.max(...cols.map((c) => this.doc.font('semibold').fontSize(8).heightOfString(c.header, { width: c.width - 2 * pad }))) + 2 * pad;
      const y = this.doc.y;
      this.doc.rect(M.left, y, cols.reduce((s, c) => s + c.width, 0), h).fill(TEAL);
      let x = M.left;
      for (const c of cols) {
        this.doc.font('semibold').fontSize(8).fillColor('#ffffff').text(c.header, x + pad, y + pad, { width: c.width - 2 * pad, align: c.align ?? 'left' });
        x += c.width;
      }
      this.doc.y = y + h;
    };
    // Keep the caption, the header and the first rows together.
    this.ensure(64);
    if (caption) this.para(caption, { colour: MUTED, size: 8 });
    drawHeader();
    rows.forEach((row, ri) => {
      const h = Math.max(...row.map((cell, i) => this.doc.font(cell.bold ? 'semibold' : 'regular').fontSize(8).heightOfString(cell.text, { width: cols[i].width - 2 * pad }))) + 2 * pad;
      if (this.doc.y + h > this.bottom) {
        this.doc.addPage();
        drawHeader();
      }
      const y = this.doc.y;
      if (ri % 2 === 1) this.doc.rect(M.left, y, cols.reduce((s, c) => s + c.width, 0), h).fill(ZEBRA);
      let x = M.left;
      row.forEach((cell, i) => {
        this.doc.font(cell.bold ? 'semibold' : 'regular').fontSize(8).fillColor(cell.colour ?? INK).text(cell.text, x + pad, y + pad, { width: cols[i].width - 2 * pad, align: cols[i].align ?? 'left' });
        x += cols[i].width;
      });
      this.doc.y = y + h;
    });
    this.doc.font('regular').fontSize(9).fillColor(INK);
  }

  /** Header and page numbers on every page, drawn once all pages exist. */
  finish(): void {
    const range = this.doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      this.doc.switchToPage(i);
      // Writing inside the margins would otherwise start a new page.
      const bottomMargin = this.doc.page.margins.bottom;
      this.doc.page.margins.bottom = 0;
      this.doc.font('bold').fontSize(10).fillColor(TEAL).text(REPORT_TITLE, M.left, 28, { width: this.width * 0.7, lineBreak: false });
      this.doc.font('regular').fontSize(9).fillColor(MUTED).text(`Lot ${this.d.lot.ref} · ${this.d.part.number} rev ${this.d.part.revision}`, M.left + this.width * 0.5, 29, { width: this.width * 0.5, align: 'right', lineBreak: false });
      this.doc.moveTo(M.left, 46).lineTo(M.left + this.width, 46).lineWidth(1.2).strokeColor('#b4652e').stroke();
      const fy = this.doc.page.height - 36;
      this.doc.font('regular').fontSize(8).fillColor(MUTED).text(`Generated ${utc(this.d.generatedAt)} by ${this.d.generatedBy}`, M.left, fy, { width: this.width * 0.7, lineBreak: false });
      this.doc.text(`Page ${i - range.start + 1} of ${range.count}`, M.left + this.width * 0.6, fy, { width: this.width * 0.4, align: 'right', lineBreak: false });
      this.doc.page.margins.bottom = bottomMargin;
    }
  }
}

function samplingLine(s: StoredSampling): string {
  if (s.kind === 'zero-acceptance') return `Zero-acceptance plan (c = 0): n = ${s.sampleSize}, accept on 0, reject on 1${s.inspectAll ? ', every core inspected' : ''}.`;
  return [
    `Single sampling, inspection level ${s.level ?? '—'}, AQL ${s.aql ?? '—'}, ${s.severity} inspection`,
    `code letter ${s.codeLetter ?? '—'}${s.planLetter && s.planLetter !== s.codeLetter ? ` (plan ${s.planLetter})` : ''}`,
    `n = ${s.sampleSize}, Ac ${s.accept}, Re ${s.reject}${s.inspectAll ? ', every core inspected' : ''}`,
  ].join(' · ');
}

function resultCell(r: LotReportData['readings'][number] | undefined): Cell {
  if (!r) return { text: '—', colour: MUTED };
  const bad = r.conforming === false || r.pass === false;
  const text = r.pass != null && r.value == null ? (r.pass ? 'pass' : 'FAIL') : num(r.value);
  return bad ? { text: `${text} *`, colour: BAD, bold: true } : { text };
}

/** Renders the report; the whole file is built in memory (it is bounded by MAX_PDF_CORES). */
export function renderLotReport(d: LotReportData): Promise<Buffer> {
  const r = new Report(d);
  const doc = r.doc;
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (c: Buffer) => chunks.push(c));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  // ── Title
  doc.font('bold').fontSize(18).fillColor(INK).text(`Lot ${d.lot.ref}`, M.left, M.top, { continued: true });
  doc.font('regular').fontSize(12).fillColor(MUTED).text(`   supplier lot ${d.lot.supplierLotNumber}`);
  const verdict = d.lot.decision === 'accept' ? { t: 'ACCEPTED', c: GOOD } : d.lot.decision === 'reject' ? { t: 'REJECTED', c: BAD } : { t: 'NOT YET DECIDED', c: MUTED };
  doc.moveDown(0.2);
  r.para(`${verdict.t} · status ${d.lot.status}`, { colour: verdict.c, font: 'bold', size: 11 });

  r.heading('Lot');
  r.facts([
    ['Supplier', `${d.supplier.name} (${d.supplier.code})`],
    ['Part', `${d.part.number} rev ${d.part.revision}`],
    ['Description', d.part.description],
    ['Construction', `${d.part.construction} · ${d.part.steelGrade}`],
    ['Quantity', `${d.lot.quantity.toLocaleString('en-GB')} cores`],
    ['PO', d.lot.poNumber ?? '—'],
    ['Received', utc(d.lot.receivedAt)],
    ['Received by', d.lot.receivedBy ?? '—'],
    ['Heat numbers', d.lot.heatNumbers.join(', ') || '—'],
    ['Packaging', d.lot.packaging],
    ['Certificate', d.lot.certificate ?? 'none attached'],
    ['Plan revision', `rev ${d.plan.revision} (${d.plan.status}${d.plan.activatedAt ? `, active since ${utc(d.plan.activatedAt)}` : ''})`],
  ]);

  r.heading('Sampling');
  r.para(samplingLine(d.sampling));
  r.para(`Table: ${d.sampling.table}`, { colour: MUTED, size: 8 });

  r.heading('Characteristics');
  r.table(
    [
      { header: 'Code', width: 62 },
      { header: 'Name', width: 142 },
      { header: 'Kind', width: 54 },
      { header: 'Unit', width: 40 },
      { header: 'Lower', width: 52, align: 'right' },
      { header: 'Nominal', width: 52, align: 'right' },
      { header: 'Upper', width: 52, align: 'right' },
      { header: 'Severity', width: 45 },
    ],
    d.characteristics.map((c) => [{ text: c.code, bold: true }, { text: c.name }, { text: c.kind }, { text: c.unit ?? '—' }, { text: num(c.lsl) }, { text: num(c.nominal) }, { text: num(c.usl) }, { text: c.severity }]),
  );

  // ── Per-core results, a group of characteristics at a time so columns stay readable.
  r.heading('Results per core');
  const byKey = new Map(d.readings.map((x) => [`${x.serial}|${x.code}`, x]));
  const perGroup = 7;
  const groups: LotReportData['characteristics'][] = [];
  for (let i = 0; i < d.characteristics.length; i += perGroup) groups.push(d.characteristics.slice(i, i + perGroup));
  if (!d.cores.length || !groups.length) r.para('No sampled cores or characteristics.', { colour: MUTED });
  const coreW = 40;
  groups.forEach((g, gi) => {
    const w = Math.floor((doc.page.width - M.left - M.right - coreW) / perGroup);
    r.table(
      [{ header: 'Core', width: coreW, align: 'right' }, ...g.map((c) => ({ header: `${c.code}${c.unit ? ` (${c.unit})` : ''}`, width: w, align: 'right' as const }))],
      d.cores.map((serial) => [{ text: String(serial), bold: true }, ...g.map((c) => resultCell(byKey.get(`${serial}|${c.code}`)))]),
      groups.length > 1 ? `Characteristics ${gi * perGroup + 1}–${gi * perGroup + g.length} of ${d.characteristics.length}` : undefined,
    );
    doc.moveDown(0.4);
  });
  r.para('* outside its limits, or a failed check. — not measured.', { colour: MUTED, size: 8 });

  // ── Gauges, with the due date they had when the readings were taken.
  const gauges = new Map<string, { tag: string; due: string | null; n: number }>();
  for (const x of d.readings) {
    if (!x.gaugeId) continue;
    const k = `${x.gaugeId}|${x.gaugeDueOn}`;
    const g = gauges.get(k) ?? { tag: x.gaugeAssetTag ?? x.gaugeId, due: x.gaugeDueOn, n: 0 };
    g.n++;
    gauges.set(k, g);
  }
  r.heading('Gauges used');
  if (gauges.size) {
    r.table(
      [{ header: 'Asset tag', width: 160 }, { header: 'Calibration due (at the time)', width: 180 }, { header: 'Readings', width: 80, align: 'right' }],
      [...gauges.values()].map((g) => [{ text: g.tag, bold: true }, { text: g.due ?? '—' }, { text: String(g.n) }]),
    );
  } else r.para('No gauge readings.', { colour: MUTED });

  r.heading('Decision');
  if (d.lot.decision) {
    r.para(`${d.lot.decision === 'accept' ? 'Accepted' : 'Rejected'} by ${d.lot.decidedBy ?? 'unknown'} on ${utc(d.lot.decidedAt)}`, { font: 'semibold', size: 10, colour: verdict.c });
    if (d.lot.nonconformingCount != null) r.para(`${d.lot.nonconformingCount} nonconforming of ${d.sampling.sampleSize} sampled cores (accept on ${d.sampling.accept}, reject on ${d.sampling.reject}).`);
    if (d.lot.decisionComment) r.para(`Comment: ${d.lot.decisionComment}`);
  } else r.para('The lot has not been decided yet.', { colour: MUTED });
  if (d.ncrs.length || d.scars.length) {
    r.heading('Nonconformance and corrective action');
    for (const n of d.ncrs) r.para(`${n.number} · ${n.status} · ${n.title}`);
    for (const x of d.scars) r.para(`${x.number} · ${x.status}`);
  }

  if (d.photos.length) {
    r.heading('Photos');
    const size = 112;
    const gap = 12;
    const perRow = Math.floor((doc.page.width - M.left - M.right + gap) / (size + gap));
    for (let i = 0; i < d.photos.length; i += perRow) {
      r.ensure(size + 28);
      const y = doc.y;
      d.photos.slice(i, i + perRow).forEach((p, j) => {
        const x = M.left + j * (size + gap);
        doc.rect(x, y, size, size).lineWidth(0.5).strokeColor(RULE).stroke();
        if (p.image) {
          try {
            doc.image(p.image, x + 1, y + 1, { fit: [size - 2, size - 2], align: 'center', valign: 'center' });
          } catch {
            doc.font('regular').fontSize(8).fillColor(MUTED).text('image unreadable', x + 4, y + size / 2 - 4, { width: size - 8, align: 'center' });
          }
        } else doc.font('regular').fontSize(8).fillColor(MUTED).text('image unavailable', x + 4, y + size / 2 - 4, { width: size - 8, align: 'center' });
        doc.font('regular').fontSize(7).fillColor(MUTED).text(p.caption ?? '', x, y + size + 3, { width: size, height: 20, ellipsis: true });
      });
      doc.y = y + size + 26;
    }
    if (d.morePhotos) r.para(`${d.morePhotos} more photo${d.morePhotos === 1 ? '' : 's'} in the lot file.`, { colour: MUTED });
  }

  r.heading('Audit records of this lot');
  r.table(
    [{ header: 'Record', width: 50, align: 'right' }, { header: 'Time (UTC)', width: 90 }, { header: 'Action', width: 120 }, { header: 'By', width: 140 }, { header: 'Hash', width: 99 }],
    d.audit.map((a) => [{ text: `#${a.id}` }, { text: utc(a.at).replace(' UTC', '') }, { text: a.action }, { text: a.actor ?? '—' }, { text: `${a.hash.slice(0, 12)}…` }]),
  );
  r.para('Each record is chained by SHA-256 to the one before it; the History ledger verifies the whole chain.', { colour: MUTED, size: 8 });

  r.finish();
  doc.end();
  return done;
}
