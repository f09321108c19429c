import type { Ncr } from '../../shared/schemas/ncr';
import { NCR_STATUS_LABELS } from '../../shared/schemas/ncr';
import type { Scar } from '../../shared/schemas/corrective-action';
import { SCAR_STATUS_LABELS, STEP_STATUS_LABELS } from '../../shared/schemas/corrective-action';
import { BAD, GOOD, MUTED, ReportDoc, money, utc } from './report-pdf';

export const NCR_REPORT_TITLE = 'Yokeline — Nonconformance report';
export const SCAR_REPORT_TITLE = 'Yokeline — 8D corrective action report';

export interface NcrReportData {
  generatedAt: Date;
  generatedBy: string;
  ncr: Ncr;
  photos: { image: Buffer | null; caption: string | null }[];
  morePhotos: number;
}

export interface ScarReportData {
  generatedAt: Date;
  generatedBy: string;
  scar: Scar;
}

/** `atSupplier` → `At supplier`: the answer's own field names, made readable. */
const label = (k: string): string => {
  const s = k.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
  return s.charAt(0).toUpperCase() + s.slice(1);
};

function inline(v: unknown): string {
  if (v === null || v === undefined || v === '') return '—';
  if (Array.isArray(v)) return v.map(inline).join('; ');
  if (typeof v === 'object') return Object.entries(v as Record<string, unknown>).map(([k, x]) => `${label(k).toLowerCase()} ${inline(x)}`).join(', ');
  return String(v);
}

/** A step answer as readable lines: one per field, one per item of a list of records (team members, actions). */
export function answerText(answer: Record<string, unknown> | null): string {
  if (!answer || !Object.keys(answer).length) return '';
  const lines: string[] = [];
  for (const [k, v] of Object.entries(answer)) {
    if (Array.isArray(v) && v.some((x) => x && typeof x === 'object')) {
      lines.push(`${label(k)}:`);
      for (const item of v) lines.push(`  • ${inline(item)}`);
    } else lines.push(`${label(k)}: ${inline(v)}`);
  }
  return lines.join('\n');
}

/** The NCR as one PDF: what was required and found, how it was dispositioned, and who signed. */
export function renderNcrReport(d: NcrReportData): Promise<Buffer> {
  const n = d.ncr;
  const r = new ReportDoc({ title: NCR_REPORT_TITLE, subject: `${n.number}${n.partNumber ? ` · ${n.partNumber} rev ${n.partRevision ?? '—'}` : ''}`, generatedAt: d.generatedAt, generatedBy: d.generatedBy });
  r.title(n.number, n.title);
  r.para(`${NCR_STATUS_LABELS[n.status] ?? n.status} · raised ${utc(n.raisedAt)}${n.raisedByName ? ` by ${n.raisedByName}` : ''}`, { colour: n.status === 'closed' ? GOOD : BAD, font: 'bold', size: 11 });

  r.heading('Nonconformance');
  r.facts([
    ['Supplier', n.supplierName ? `${n.supplierName} (${n.supplierCode})` : '—'],
    ['Part', n.partNumber ? `${n.partNumber} rev ${n.partRevision ?? '—'}` : '—'],
    ['Lot', n.lotRef != null ? `Lot ${n.lotRef} · supplier lot ${n.supplierLotNumber ?? '—'}` : '—'],
    ['Source', n.source],
    ['Defect codes', n.defectCodes.join(', ')],
    ['Suspect quantity', `${n.suspectQuantity.toLocaleString('en-GB')} cores`],
    ['Characteristic', n.characteristicCode ?? '—'],
    ['Corrective action', n.scarNumber ?? 'none issued'],
  ]);
  r.heading('Requirement and what was found');
  r.para('Requirement', { font: 'semibold', colour: MUTED });
  r.para(n.requirement);
  r.para('Found', { font: 'semibold', colour: MUTED });
  r.para(n.found);
  if (n.readings.length) {
    r.table(
      [{ header: 'Core', width: 50, align: 'right' }, { header: 'Characteristic', width: 110 }, { header: 'Value', width: 80, align: 'right' }, { header: 'Readings', width: 160 }, { header: 'Conforming', width: 99 }],
      n.readings.map((x) => [
        { text: x.serial != null ? String(x.serial) : '—', bold: true },
        { text: x.characteristicCode },
        { text: x.value != null ? String(Number(x.value.toFixed(4))) : x.pass != null ? (x.pass ? 'pass' : 'FAIL') : '—' },
        { text: x.values.join(', ') || '—' },
        { text: x.conforming === false ? 'no' : x.conforming ? 'yes' : '—', colour: x.conforming === false ? BAD : undefined, bold: x.conforming === false },
      ]),
      'Readings linked to this NCR',
    );
  }

  r.heading('Disposition');
  if (n.dispositions.length) {
    r.table(
      [{ header: 'Kind', width: 70 }, { header: 'Qty', width: 40, align: 'right' }, { header: 'Rationale', width: 210 }, { header: 'Concession', width: 80 }, { header: 'Cost', width: 99, align: 'right' }],
      n.dispositions.map((x) => [{ text: x.kind, bold: true }, { text: String(x.quantity) }, { text: x.rationale }, { text: x.concessionRef ?? '—' }, { text: money(x.cost) }]),
    );
    r.para(`Total cost ${money(n.totalCost)}`, { font: 'semibold' });
  } else r.para('Not dispositioned yet.', { colour: MUTED });

  r.heading('Electronic signatures');
  if (n.signatures.length) {
    for (const s of n.signatures) {
      r.para(`${s.signerName} <${s.signerEmail}> · ${s.purpose} · ${utc(s.signedAt)}`, { font: 'semibold' });
      r.para(`Meaning: ${s.meaning}`);
      r.para(`Signed content SHA-256: ${s.contentHash}`, { colour: MUTED, size: 8 });
      r.doc.moveDown(0.3);
    }
  } else r.para('No signatures.', { colour: MUTED });

  if (d.photos.length) {
    r.heading('Photos');
    r.photos(d.photos);
    if (d.morePhotos) r.para(`${d.morePhotos} more photo${d.morePhotos === 1 ? '' : 's'} on the NCR.`, { colour: MUTED });
  }

  if (n.history.length) {
    r.heading('History');
    r.table(
      [{ header: 'Time (UTC)', width: 100 }, { header: 'Action', width: 130 }, { header: 'By', width: 140 }, { header: 'Reason', width: 129 }],
      n.history.map((h) => [{ text: utc(h.at).replace(' UTC', '') }, { text: h.action }, { text: h.actorEmail ?? '—' }, { text: h.reason ?? '' }]),
    );
  }
  return r.end();
}

/** The 8D request as one PDF: each step with its status, due date, the supplier's answer and the engineer's review. */
export function renderScarReport(d: ScarReportData): Promise<Buffer> {
  const s = d.scar;
  const r = new ReportDoc({ title: SCAR_REPORT_TITLE, subject: `${s.number} · ${s.supplierCode}`, generatedAt: d.generatedAt, generatedBy: d.generatedBy });
  r.title(s.number, s.title);
  r.para(`${SCAR_STATUS_LABELS[s.status] ?? s.status} · issued ${utc(s.issuedAt)}`, { colour: s.status === 'closed' ? GOOD : s.status === 'returned' ? BAD : MUTED, font: 'bold', size: 11 });

  r.heading('Request');
  r.facts([
    ['Supplier', `${s.supplierName} (${s.supplierCode})`],
    ['From NCR', s.ncrNumber],
    ['Part', s.partNumber ? `${s.partNumber} rev ${s.partRevision ?? '—'}` : '—'],
    ['Defect codes', s.defectCodes.join(', ')],
    ['Acknowledged', utc(s.acknowledgedAt)],
    ['Accepted', utc(s.acceptedAt)],
    ['Closed', utc(s.closedAt)],
    ['Verification', `${s.verification.passed} of ${s.verification.required} clean lots`],
  ]);
  r.para('Problem', { font: 'semibold', colour: MUTED });
  r.para(s.problem);

  r.heading('8D steps');
  for (const st of s.steps) {
    r.ensure(60);
    r.para(`${st.step} · ${st.title}`, { font: 'bold', size: 10 });
    r.para(`Status: ${STEP_STATUS_LABELS[st.status] ?? st.status} · due ${st.dueOn ?? '—'}${st.overdue ? ' (overdue)' : ''} · submitted ${utc(st.submittedAt)}`, { colour: st.overdue ? BAD : MUTED, size: 8 });
    const text = answerText(st.answer);
    r.para(text || 'No answer submitted yet.', text ? {} : { colour: MUTED });
    if (st.evidence.length) r.para(`Evidence: ${st.evidence.map((e) => e.name).join(', ')}`, { colour: MUTED, size: 8 });
    if (st.reviewDecision) {
      r.para(`Review: ${st.reviewDecision === 'accept' ? 'accepted' : 'returned'} ${utc(st.reviewedAt)}${st.reviewComment ? ` — ${st.reviewComment}` : ''}`, { colour: st.reviewDecision === 'accept' ? GOOD : BAD, font: 'semibold' });
    }
    r.doc.moveDown(0.4);
  }

  if (s.history?.length) {
    r.heading('History');
    r.table(
      [{ header: 'Time (UTC)', width: 100 }, { header: 'Action', width: 130 }, { header: 'By', width: 140 }, { header: 'Reason', width: 129 }],
      s.history.map((h) => [{ text: utc(h.at).replace(' UTC', '') }, { text: h.action }, { text: h.actorEmail ?? '—' }, { text: h.reason ?? '' }]),
    );
  }
  return r.end();
}
