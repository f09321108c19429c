import QRCode from 'qrcode';
import { escapeHtml, publicLink } from '../mail/mail-templates';

export interface HoldTagData {
  number: string;
  title: string;
  partNumber: string | null;
  partRevision: string | null;
  partDescription: string | null;
  supplierCode: string | null;
  lotRef: number | null;
  supplierLotNumber: string | null;
  quantity: number;
  raisedAt: Date;
  defectCodes: string[];
}

/** Where the QR code on a tag leads: the NCR in the web app (sign-in first if needed). */
export function ncrUrl(publicUrl: string, id: string): string {
  return publicLink(publicUrl, `/nonconformances/${id}`);
}

export function qrSvg(url: string): Promise<string> {
  return QRCode.toString(url, { type: 'svg', errorCorrectionLevel: 'M', margin: 1 });
}

/**
 * The red hold tag as a standalone page sized for A6 label stock (105 × 148 mm). Everything
 * from the database is escaped; the QR code is an inline SVG made here from the NCR's address.
 */
export async function renderHoldTag(d: HoldTagData, url: string): Promise<string> {
  const svg = await qrSvg(url);
  const row = (k: string, v: string) => `<div class="k">${escapeHtml(k)}</div><div class="v">${escapeHtml(v)}</div>`;
  const part = d.partNumber ? `${d.partNumber} rev ${d.partRevision ?? ''}`.trim() : '—';
  const lotText = d.lotRef != null ? `#${d.lotRef}${d.supplierLotNumber ? ` · ${d.supplierLotNumber}` : ''}` : '—';
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>Hold tag ${escapeHtml(d.number)}</title>
<style>
@page { size: 105mm 148mm; margin: 0; }
* { box-sizing: border-box; }
html, body { margin: 0; padding: 0; font-family: 'Open Sans', 'Segoe UI', Arial, sans-serif; color: #1b1b1b; background: #fff; }
.tag { width: 105mm; height: 148mm; padding: 4mm; border: 3mm solid #b3261e; display: flex; flex-direction: column; gap: 2.5mm; overflow: hidden; }
.band { background: #b3261e; color: #fff; text-align: center; font-weight: 800; font-size: 17pt; letter-spacing: 0.04em; padding: 2mm 0; -webkit-print-color-adjust: exact; print-color-adjust: exact; }
.no { font-family: 'Consolas', 'DejaVu Sans Mono', monospace; font-size: 15pt; font-weight: 700; text-align: center; }
.title { font-size: 9pt; text-align: center; }
.grid { display: grid; grid-template-columns: 22mm 1fr; gap: 1mm 2mm; font-size: 9.5pt; }
.k { color: #555; } .v { font-weight: 700; overflow-wrap: anywhere; }
.qr { display: flex; gap: 3mm; align-items: center; margin-top: auto; }
.qr svg { width: 38mm; height: 38mm; flex: none; }
.qr p { margin: 0; font-size: 7.5pt; overflow-wrap: anywhere; }
.foot { font-size: 6.5pt; color: #333; border-top: 0.3mm solid #b3261e; padding-top: 1.5mm; }
@media screen { body { padding: 16px; background: #eee; } .tag { background: #fff; box-shadow: 0 2px 8px rgba(0,0,0,.2); } }
</style></head>
<body><div class="tag" role="document" aria-label="Hold tag ${escapeHtml(d.number)}">
<div class="band">HOLD — DO NOT USE</div>
<div class="no">${escapeHtml(d.number)}</div>
<div class="title">${escapeHtml(d.title)}</div>
<div class="grid">
${row('Part', part)}
${d.partDescription ? row('', d.partDescription) : ''}
${row('Supplier', d.supplierCode ?? '—')}
${row('Lot', lotText)}
${row('Quantity', `${d.quantity} core${d.quantity === 1 ? '' : 's'}`)}
${row('Date', d.raisedAt.toISOString().slice(0, 10))}
${row('Defect', d.defectCodes.join(', ') || '—')}
</div>
<div class="qr">${svg}<p>Scan to open the nonconformance report.<br>${escapeHtml(url)}</p></div>
<div class="foot">Nonconforming product: keep segregated, do not move to the line. Remove this tag only when the NCR is dispositioned. Lamination edges cut: handle with cut-resistant gloves; lift heavy cores by hoist or team lift as the site procedure says.</div>
</div></body></html>`;
}
