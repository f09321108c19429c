import { Tab, TabList, makeStyles } from '@fluentui/react-components';
import { useSearchParams } from 'react-router-dom';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { useMe } from '../../features/auth/api/get-me';
import { ChainBadge } from '../../features/ledger/components/chain-badge';
import { LotSearch } from '../../features/ledger/components/lot-search';
import { AuditBrowser } from '../../features/ledger/components/audit-browser';

const useStyles = makeStyles({
  tabs: { marginBottom: '16px' },
});

/** Who may read the ledger (the API says the same). */
export const LEDGER_ROLES = ['auditor', 'engineer', 'admin'] as const;
export const useCanReadLedger = () => {
  const { data } = useMe();
  return !!data && (LEDGER_ROLES as readonly string[]).includes(data.role);
};

/** The History ledger: find a lot and follow its story, or browse the raw audit records. */
export function LedgerPage() {
  const s = useStyles();
  const canRead = useCanReadLedger();
  const [sp, setSp] = useSearchParams();
  const tab = sp.get('tab') === 'audit' ? 'audit' : 'lots';
  if (!canRead) {
    return (
      <Page title="History ledger">
        <EmptyState title="The History ledger is for auditors, engineers and administrators">Ask an administrator if you need to read the audit history.</EmptyState>
      </Page>
    );
  }
  return (
    <Page title="History ledger" lead="Who measured what, with which calibrated gauge, what was decided and by whom — and proof that no record was quietly changed.">
      <ChainBadge />
      <TabList
        className={s.tabs}
        selectedValue={tab}
        // Each tab has its own filters: switching starts it clean.
        onTabSelect={(_, d) => setSp(d.value === 'audit' ? { tab: 'audit' } : {}, { replace: true })}
        aria-label="Ledger views"
      >
        <Tab value="lots">Lots</Tab>
        <Tab value="audit">Audit records</Tab>
      </TabList>
      {tab === 'audit' ? <AuditBrowser /> : <LotSearch />}
    </Page>
  );
}
