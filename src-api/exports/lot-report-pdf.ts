import { BAD, GOOD, INK, M, MUTED, ReportDoc, RULE, utc, type Cell } from './report-pdf';
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

export const REPORT_TITLE = 'Yokeline — Lot inspection report';

export { utc };
/** Numbers as measured: no float noise, at most 4 decimals. */
export const num = (v: number | null | undefined): string => (v == null ? '—' : String(Number(v.toFixed(4))));

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
  // The shared report layout (fonts, tables, running header and page numbers).
  const r = new ReportDoc({ title: REPORT_TITLE, subject: `Lot ${d.lot.ref} · ${d.part.number} rev ${d.part.revision}`, generatedAt: d.generatedAt, generatedBy: d.generatedBy });
  const doc = r.doc;

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

  return r.end();
}
