import { makeStyles, Subtitle1, Body1, tokens, Caption1 } from '@fluentui/react-components';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { Mark } from '../../components/mark';

const useStyles = makeStyles({
  page: {
    minHeight: '100vh',
    display: 'grid',
    gridTemplateColumns: 'minmax(0, 1fr) minmax(360px, 460px)',
    '@media (max-width: 820px)': { gridTemplateColumns: '1fr' },
    backgroundColor: tokens.colorNeutralBackground2,
  },
  side: {
    backgroundColor: '#0c3d39',
    color: '#d8e6e2',
    padding: '56px',
    display: 'flex',
    flexDirection: 'column',
    justifyContent: 'space-between',
    backgroundImage:
      'repeating-linear-gradient(180deg, rgba(216,230,226,0.06) 0 2px, transparent 2px 9px)',
    '@media (max-width: 820px)': { display: 'none' },
  },
  brand: { display: 'flex', alignItems: 'center', gap: '14px', fontSize: '28px', fontWeight: 700, letterSpacing: '0.02em' },
  pitch: { maxWidth: '520px', fontSize: '18px', lineHeight: '28px' },
  panel: { display: 'flex', alignItems: 'center', justifyContent: 'center', padding: '32px' },
  card: {
    width: '100%',
    maxWidth: '380px',
    backgroundColor: tokens.colorNeutralBackground1,
    padding: '32px',
    borderRadius: tokens.borderRadiusLarge,
    boxShadow: tokens.shadow8,
    display: 'flex',
    flexDirection: 'column',
    gap: tokens.spacingVerticalL,
    borderTop: '4px solid #b4652e',
  },
});

export function SignInPage() {
  const s = useStyles();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const next = params.get('next');
  const safeNext = next && next.startsWith('/') && !next.startsWith('//') ? next : '/';
  return (
    <main className={s.page}>
      <section className={s.side} aria-hidden="true">
        <div className={s.brand}>
          <Mark size={40} /> Yokeline
        </div>
        <p className={s.pitch}>
          Incoming inspection for laminated stator cores: sample the lot, measure the stack, decide it, and follow every
          held lot through review to the supplier’s fix.
        </p>
        <Caption1>Harrowgate Drive Systems · receiving quality</Caption1>
      </section>
      <section className={s.panel}>
        <div className={s.card}>
          <div>
            <Subtitle1 as="h1" style={{ display: 'block', margin: 0 }}>Sign in to Yokeline</Subtitle1>
            <Body1 as="p" style={{ display: 'block', color: tokens.colorNeutralForeground3, margin: '4px 0 0' }}>
              Use the account your plant or your company was given.
            </Body1>
          </div>
          <SignInForm onSignedIn={() => navigate(safeNext, { replace: true })} />
        </div>
      </section>
    </main>
  );
}
