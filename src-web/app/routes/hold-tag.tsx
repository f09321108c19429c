import { Body1, Button, makeStyles, tokens } from '@fluentui/react-components';
import { useEffect } from 'react';
import { Link, useParams } from 'react-router-dom';
import { paths } from '../../config/paths';
import { Loading } from '../../components/data-table';
import { EmptyState } from '../../components/empty-state';
import { useNcr } from '../../features/ncrs/api/ncrs';
import { HoldTag } from '../../features/ncrs/components/hold-tag';

const useStyles = makeStyles({
  sheet: { minHeight: '100vh', padding: '24px', backgroundColor: tokens.colorNeutralBackground3, display: 'flex', flexDirection: 'column', alignItems: 'center', gap: '16px' },
  bar: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap', justifyContent: 'center' },
  touch: { minHeight: '44px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
});

/** The print view of an NCR's hold tag: only the tag, on an A6 page. */
export function HoldTagPage() {
  const s = useStyles();
  const { id = '' } = useParams();
  const ncr = useNcr(id);
  useEffect(() => {
    if (ncr.data) document.title = `Hold tag ${ncr.data.number} · Yokeline`;
  }, [ncr.data]);
  if (ncr.isPending) return <Loading label="Preparing the tag" />;
  if (ncr.error) return <EmptyState title="This tag cannot be printed">{ncr.error.message}</EmptyState>;
  return (
    <main className={`${s.sheet} hold-tag-sheet`}>
      <div className={`${s.bar} no-print`}>
        <Button className={s.touch} appearance="primary" onClick={() => window.print()}>Print</Button>
        <Link className={s.link} to={paths.ncr(id)}>Back to {ncr.data.number}</Link>
        <Body1>Load A6 label stock (105 × 148 mm); the tag fills the page.</Body1>
      </div>
      <HoldTag ncr={ncr.data} url={`${window.location.origin}${paths.ncr(id)}`} />
    </main>
  );
}
