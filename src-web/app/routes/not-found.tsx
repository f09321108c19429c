import { Link } from 'react-router-dom';
import { Page } from '../../components/page';
import { EmptyState } from '../../components/empty-state';

export function NotFoundPage() {
  return (
    <Page title="Page not found">
      <EmptyState title="There is no page at this address" action={<Link to="/">Go to your home page</Link>}>
        The link may be old, or the record may not be yours to see.
      </EmptyState>
    </Page>
  );
}
