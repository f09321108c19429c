import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';
import { NAV } from '../../config/nav';

/** An honest placeholder for a page a later piece of work fills. */
export function ArrivesSoon({ to }: { to: string }) {
  const item = NAV.find((n) => n.to === to);
  const title = item?.label ?? 'Coming';
  return (
    <Page title={title} lead={item?.purpose}>
      <EmptyState title="This page arrives soon">
        {title} is being built. Nothing here is missing or lost: there is simply nothing to show on it yet.
      </EmptyState>
    </Page>
  );
}
