import { Body1 } from '@fluentui/react-components';
import type { PlanSummary } from '@shared/schemas/master-data';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { useActivatePlan } from '../api/plans';

type Activatable = Pick<PlanSummary, 'id' | 'revision' | 'version' | 'partNumber' | 'partRevision'>;

/** Activation is one-way: the part's current active plan is superseded in the same step. */
export function ActivateDialog({ plan, currentActiveRevision, onClose, onDone }: {
  plan: Activatable | null;
  currentActiveRevision?: number | null;
  onClose: () => void;
  onDone?: () => void;
}) {
  const activate = useActivatePlan();
  return (
    <ConfirmDialog
      open={!!plan}
      title={plan ? `Activate plan revision ${plan.revision}?` : 'Activate plan'}
      confirmLabel="Activate"
      onClose={onClose}
      onConfirm={async () => {
        if (!plan) return;
        await activate.mutateAsync({ id: plan.id, version: plan.version });
        onDone?.();
      }}
    >
      {plan ? (
        <>
          <Body1>
            Lots of {plan.partNumber} rev {plan.partRevision} received from now on are inspected to plan revision {plan.revision}.
            {currentActiveRevision ? ` Revision ${currentActiveRevision}, active now, becomes superseded.` : ''}
          </Body1>
          <Body1>An active plan is never edited. To change it later, revise it into a new draft.</Body1>
        </>
      ) : null}
    </ConfirmDialog>
  );
}
