import { Card, CardHeader, makeStyles, Text, tokens } from '@fluentui/react-components';
import { Link } from 'react-router-dom';
import { ROLE_LABELS, type SessionUser } from '@shared/schemas/auth';
import { Page } from '../../components/page';
import { navFor } from '../../config/nav';

const useStyles = makeStyles({
  grid: { display: 'grid', gridTemplateColumns: 'repeat(auto-fill, minmax(260px, 1fr))', gap: '16px' },
  card: { minHeight: '120px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600, textDecoration: 'none', fontSize: tokens.fontSizeBase400 },
});

/** Home: where this role's work lives. The role dashboards fill this with live counts. */
export function HomePage({ user }: { user: SessionUser }) {
  const s = useStyles();
  return (
    <Page title={`Good to see you, ${user.name.split(' ')[0]}`} lead={`Signed in as ${ROLE_LABELS[user.role].toLowerCase()}.`}>
      <div className={s.grid}>
        {navFor(user.role).map((n) => (
          <Card key={n.to} className={s.card}>
            <CardHeader header={<Link to={n.to} className={s.link}>{n.label}</Link>} />
            <Text>{n.purpose}</Text>
          </Card>
        ))}
      </div>
    </Page>
  );
}
