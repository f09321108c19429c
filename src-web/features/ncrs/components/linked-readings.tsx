import { Caption1, Table, TableBody, TableCell, TableHeader, TableRow, makeStyles, tokens } from '@fluentui/react-components';
import { withinLimits } from '@shared/compute/evaluate';
import type { LinkedReading } from '@shared/schemas/ncr';
import { HeadCell, TableFrame } from '../../../components/data-table';
import { limitsText } from '../../lots/components/sheet-model';
import { formatValue } from './ncr-status';

const useStyles = makeStyles({
  num: { textAlign: 'right', fontVariantNumeric: 'tabular-nums' },
  bad: { color: tokens.colorPaletteRedForeground1, fontWeight: 600 },
  muted: { color: tokens.colorNeutralForeground3 },
});

/** What the table needs of a reading; the supplier's view has no ids or inspectors' notes. */
type Row = Omit<LinkedReading, 'id' | 'sampleId' | 'note'> & { id?: string; note?: string | null };

/** The readings of one core, those beyond the limits marked in words as well as colour. */
function ReadingValues({ r }: { r: Row }) {
  const s = useStyles();
  return (
    <span>
      {r.values.map((v, i) => {
        const out = r.eachReadingJudged && !withinLimits(v, r.lsl, r.usl);
        return (
          <span key={i}>
            {i ? ', ' : ''}
            {out ? <span className={s.bad} title="beyond the limit">{formatValue(v)} (out)</span> : <span className={s.muted}>{formatValue(v)}</span>}
          </span>
        );
      })}
    </span>
  );
}

/** The readings an NCR links to: per core, the characteristic, its limits, the value and each reading. */
export function LinkedReadingsTable({ readings, label = 'Linked readings' }: { readings: Row[]; label?: string }) {
  const s = useStyles();
  return (
    <TableFrame>
      <Table aria-label={label} size="small">
        <TableHeader>
          <TableRow><HeadCell>Core</HeadCell><HeadCell>Characteristic</HeadCell><HeadCell>Limits</HeadCell><HeadCell>Value</HeadCell><HeadCell>Readings</HeadCell><HeadCell>Result</HeadCell></TableRow>
        </TableHeader>
        <TableBody>
          {readings.map((r, i) => (
            <TableRow key={r.id ?? `${r.serial}-${r.characteristicCode}-${i}`}>
              <TableCell>{r.serial ?? '—'}</TableCell>
              <TableCell>
                <strong>{r.characteristicCode}</strong> <span className={s.muted}>{r.name !== r.characteristicCode ? r.name : ''}</span>
              </TableCell>
              <TableCell className={s.muted}>{limitsText(r) || '—'}</TableCell>
              <TableCell className={s.num}>
                {r.value != null ? formatValue(r.value) : r.pass == null ? '—' : r.pass ? 'pass' : 'fail'}
                {r.value != null && r.values.length > 1 ? <Caption1 className={s.muted} block>mean of {r.values.length}</Caption1> : null}
              </TableCell>
              <TableCell>{r.values.length > 1 ? <ReadingValues r={r} /> : <span className={s.muted}>{r.note || ''}</span>}</TableCell>
              <TableCell>{r.conforming === false ? <span className={s.bad}>Out of tolerance</span> : r.conforming ? 'Within tolerance' : '—'}</TableCell>
            </TableRow>
          ))}
        </TableBody>
      </Table>
    </TableFrame>
  );
}
