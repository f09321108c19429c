import { Body1, Button, Caption1, MessageBar, MessageBarBody, Spinner, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { decisionSchema, type Lot } from '@shared/schemas/receiving';
import { Form } from '../../../components/form';
import { TextAreaField, formSchema } from '../../../components/form-fields';
import { StatusPill } from '../../../components/status-pill';
import { paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api-client';
import { getLotQueryOptions, useDecideLot, useProposal } from '../api/lots';
import { LotStatusPill, isOpenLot } from './lot-status';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  root: { display: 'flex', flexDirection: 'column', gap: '12px', maxWidth: '760px' },
  proposal: { display: 'flex', gap: '10px', alignItems: 'center', flexWrap: 'wrap' },
  counts: { display: 'flex', gap: '16px', flexWrap: 'wrap', color: tokens.colorNeutralForeground2 },
  actions: { display: 'flex', gap: '10px', flexWrap: 'wrap', marginTop: '10px' },
  touch: { minHeight: '48px', minWidth: '160px', fontSize: tokens.fontSizeBase400 },
  reject: {
    backgroundColor: tokens.colorPaletteRedBackground3,
    color: tokens.colorNeutralForegroundOnBrand,
    ':hover': { backgroundColor: tokens.colorPaletteRedForeground1, color: tokens.colorNeutralForegroundOnBrand },
    ':hover:active': { backgroundColor: tokens.colorPaletteRedForeground1, color: tokens.colorNeutralForegroundOnBrand },
    ':disabled': { backgroundColor: tokens.colorNeutralBackgroundDisabled, color: tokens.colorNeutralForegroundDisabled },
  },
  why: { color: tokens.colorNeutralForeground3 },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
});

type DecisionForm = { decision: 'accept' | 'reject'; comment: string; version: number };

/**
 * What the results propose (the server's rule: nonconforming cores against Ac/Re, any critical
 * failure rejects), and the inspector's decision with a comment for the record.
 */
export function DecisionPanel({ lot, canDecide, unsent }: { lot: Lot; canDecide: boolean; unsent: number }) {
  const s = useStyles();
  const qc = useQueryClient();
  const open = isOpenLot(lot.status);
  const proposal = useProposal(lot.id, open && canDecide);
  const decide = useDecideLot();

  if (!open) {
    const held = lot.status === 'on-hold' || lot.decision === 'reject';
    return (
      <div className={s.root}>
        <div className={s.proposal}>
          <LotStatusPill status={lot.status} />
          <Body1>
            {lot.decision === 'accept' ? 'Accepted' : lot.decision === 'reject' ? 'Rejected' : 'Decided'}
            {lot.decidedAt ? ` on ${formatWhen(lot.decidedAt)}` : ''}
            {lot.nonconformingCount != null ? ` · ${lot.nonconformingCount} nonconforming in the sample` : ''}
          </Body1>
        </div>
        {lot.decisionComment ? <Body1>“{lot.decisionComment}”</Body1> : null}
        {held ? (
          <Body1>
            The lot stays red-tagged in the hold area, away from the winding line. Its nonconformance report follows in review (<Link className={s.link} to={paths.ncrs}>Nonconformances</Link>), where its disposition is decided.
          </Body1>
        ) : lot.status === 'released' ? (
          <MessageBar intent="success">
            <MessageBarBody>Released to the winding line.</MessageBarBody>
          </MessageBar>
        ) : null}
      </div>
    );
  }

  if (!canDecide) return <Caption1 className={s.why}>An inspector or engineer decides this lot once its sample is inspected.</Caption1>;
  if (proposal.isPending) return <Spinner size="tiny" label="Working out the proposal" />;
  if (proposal.error) return <Caption1>The proposal cannot be loaded: {proposal.error.message}</Caption1>;
  const p = proposal.data;
  const tone = p.proposal === 'accept' ? 'ok' : p.proposal === 'reject' ? 'bad' : 'pending';
  const label = p.proposal === 'accept' ? 'Proposal: accept' : p.proposal === 'reject' ? 'Proposal: reject' : 'Not yet';
  const blocked = unsent > 0;

  return (
    <div className={s.root}>
      <div className={s.proposal}>
        <StatusPill tone={tone}>{label}</StatusPill>
        <Body1>{p.reason}.</Body1>
      </div>
      <div className={s.counts}>
        <span>{p.nonconforming} nonconforming core{p.nonconforming === 1 ? '' : 's'}</span>
        <span>Ac {lot.sampling.accept} / Re {lot.sampling.reject}</span>
        {p.criticalFailures ? <span>{p.criticalFailures} critical failure{p.criticalFailures === 1 ? '' : 's'}</span> : null}
        {p.incomplete ? <span>{p.incomplete} core{p.incomplete === 1 ? '' : 's'} not complete</span> : null}
      </div>
      {blocked ? (
        <MessageBar intent="warning">
          <MessageBarBody>{unsent} reading{unsent === 1 ? ' is' : 's are'} not sent yet. Decide once the server has them, so the decision sees every reading.</MessageBarBody>
        </MessageBar>
      ) : null}
      <Form<DecisionForm>
        schema={formSchema<DecisionForm>(decisionSchema)}
        defaultValues={{ comment: '', version: lot.version }}
        aria-label="Decision"
        onSubmit={async (v) => {
          try {
            await decide.mutateAsync({ id: lot.id, ...v, version: lot.version });
          } catch (err) {
            // Someone else decided or the results changed: show the lot as it is now.
            if (err instanceof ApiError && err.status === 409) await qc.invalidateQueries({ queryKey: getLotQueryOptions(lot.id).queryKey });
            throw err;
          }
        }}
      >
        {(form) => (
          <>
            <TextAreaField name="comment" label="Comment for the record" required hint="What you found and why you decide this way." rows={3} />
            <div className={s.actions}>
              <Button
                type="submit"
                appearance="primary"
                className={s.touch}
                disabled={blocked || p.proposal !== 'accept' || form.formState.isSubmitting}
                onClick={() => form.setValue('decision', 'accept')}
              >
                Accept lot
              </Button>
              <Button
                type="submit"
                appearance="primary"
                className={mergeClasses(s.touch, s.reject)}
                disabled={blocked || form.formState.isSubmitting}
                onClick={() => form.setValue('decision', 'reject')}
              >
                Reject lot — put on hold
              </Button>
            </div>
            <Caption1 className={s.why}>
              {p.proposal === 'reject'
                ? 'The results require rejection: a nonconforming lot is dispositioned through review, not accepted here.'
                : p.proposal === null
                  ? 'Accepting needs every sampled core inspected. A lot can be rejected at any time (for example for its paperwork).'
                  : 'Accepting releases the lot to the winding line.'}
            </Caption1>
          </>
        )}
      </Form>
    </div>
  );
}
