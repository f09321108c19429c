import { makeStyles } from '@fluentui/react-components';
import type { Ncr } from '@shared/schemas/ncr';
import { ncrQrUrl } from '../api/ncrs';

// A6 label stock (105 × 148 mm), no margins; the red must print even with "background graphics"
// off. A plain style element: the @page rule must reach the document as written. The size is
// given in mm because Chromium has no "A6" keyword (it would fall back to Letter).
const PAGE_CSS = `
@page { size: 105mm 148mm; margin: 0; }
@media print {
  html, body { margin: 0 !important; padding: 0 !important; background: #fff !important; }
  .no-print { display: none !important; }
  .hold-tag-sheet { padding: 0 !important; background: #fff !important; min-height: 0 !important; display: block !important; }
  .hold-tag { box-shadow: none !important; }
}
`;

const RED = '#b3261e';
const useStyles = makeStyles({
  tag: {
    width: '105mm',
    height: '148mm',
    boxSizing: 'border-box',
    padding: '4mm',
    border: `3mm solid ${RED}`,
    display: 'flex',
    flexDirection: 'column',
    gap: '2.5mm',
    overflow: 'hidden',
    backgroundColor: '#fff',
    color: '#1b1b1b',
    boxShadow: '0 2px 10px rgba(0,0,0,.25)',
    fontFamily: "'Open Sans', 'Segoe UI', sans-serif",
    printColorAdjust: 'exact',
    WebkitPrintColorAdjust: 'exact',
  },
  band: { backgroundColor: RED, color: '#fff', textAlign: 'center', fontWeight: 800, fontSize: '17pt', letterSpacing: '0.04em', padding: '2mm 0' },
  no: { fontFamily: "Consolas, 'DejaVu Sans Mono', monospace", fontSize: '15pt', fontWeight: 700, textAlign: 'center' },
  title: { fontSize: '9pt', textAlign: 'center', overflowWrap: 'anywhere' },
  grid: { display: 'grid', gridTemplateColumns: '22mm minmax(0, 1fr)', gap: '1mm 2mm', fontSize: '9.5pt', margin: 0 },
  k: { color: '#555' },
  v: { fontWeight: 700, margin: 0, overflowWrap: 'anywhere' },
  qr: { display: 'flex', gap: '3mm', alignItems: 'center', marginTop: 'auto' },
  qrImg: { width: '38mm', height: '38mm', flex: 'none' },
  url: { margin: 0, fontSize: '7.5pt', overflowWrap: 'anywhere' },
  foot: { fontSize: '6.5pt', color: '#333', borderTop: `0.3mm solid ${RED}`, paddingTop: '1.5mm', margin: 0 },
});

/** The red hold tag of an NCR, sized for A6 label stock, with a QR code that opens the NCR. */
export function HoldTag({ ncr, url }: { ncr: Ncr; url: string }) {
  const s = useStyles();
  const rows: [string, string][] = [
    ['Part', ncr.partNumber ? `${ncr.partNumber} rev ${ncr.partRevision ?? ''}` : '—'],
    ['Supplier', ncr.supplierCode ?? '—'],
    ['Lot', ncr.lotRef != null ? `#${ncr.lotRef}${ncr.supplierLotNumber ? ` · ${ncr.supplierLotNumber}` : ''}` : '—'],
    ['Quantity', `${ncr.suspectQuantity} core${ncr.suspectQuantity === 1 ? '' : 's'}`],
    ['Date', ncr.raisedAt.slice(0, 10)],
    ['Defect', ncr.defectCodes.join(', ') || '—'],
  ];
  return (
    <article className={`${s.tag} hold-tag`} aria-label={`Hold tag ${ncr.number}`}>
      <style>{PAGE_CSS}</style>
      <div className={s.band}>HOLD — DO NOT USE</div>
      <div className={s.no}>{ncr.number}</div>
      <div className={s.title}>{ncr.title}</div>
      <dl className={s.grid}>
        {rows.map(([k, v]) => (
          <div key={k} style={{ display: 'contents' }}>
            <dt className={s.k}>{k}</dt>
            <dd className={s.v}>{v}</dd>
          </div>
        ))}
      </dl>
      <div className={s.qr}>
        <img className={s.qrImg} src={ncrQrUrl(ncr.id)} alt={`QR code: ${url}`} />
        <p className={s.url}>Scan to open the nonconformance report.<br />{url}</p>
      </div>
      <p className={s.foot}>Nonconforming product: keep segregated, do not move to the line. Remove this tag only when the NCR is dispositioned. Lamination edges cut: handle with cut-resistant gloves; lift heavy cores by hoist or team lift as the site procedure says.</p>
    </article>
  );
}
