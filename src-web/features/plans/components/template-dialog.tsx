import {
  Button, Dialog, DialogActions, DialogBody, DialogContent, DialogSurface, DialogTitle, MessageBar, MessageBarBody, Radio, RadioGroup, makeStyles, tokens, Caption1,
} from '@fluentui/react-components';
import { useState } from 'react';
import type { Part, Plan } from '@shared/schemas/master-data';
import { Loading } from '../../../components/data-table';
import { useCreatePlanFromTemplate, usePlanTemplates } from '../api/plans';

const useStyles = makeStyles({
  touch: { minHeight: '44px' },
  group: { display: 'flex', flexDirection: 'column', gap: '4px' },
  option: { padding: '6px 8px', borderRadius: tokens.borderRadiusMedium, border: `1px solid ${tokens.colorNeutralStroke2}` },
  desc: { display: 'block', color: tokens.colorNeutralForeground3, marginLeft: '32px', marginTop: '-4px', paddingBottom: '4px' },
  body: { display: 'flex', flexDirection: 'column', gap: '12px' },
});

/** Starts a draft from the template for a core construction; the part's own is preselected. */
export function TemplateDialog({ part, open, onClose, onCreated }: { part: Part; open: boolean; onClose: () => void; onCreated: (p: Plan) => void }) {
  const s = useStyles();
  const templates = usePlanTemplates(open);
  const create = useCreatePlanFromTemplate();
  const [picked, setPicked] = useState<string | null>(null);
  const items = templates.data ?? [];
  const value = picked ?? (items.some((t) => t.id === part.construction) ? part.construction : (items[0]?.id ?? ''));
  return (
    <Dialog open={open} onOpenChange={(_, d) => !d.open && onClose()}>
      <DialogSurface aria-label="New plan from template">
        <DialogBody>
          <DialogTitle>New plan from template</DialogTitle>
          <DialogContent className={s.body}>
            <Caption1>The template fills the characteristics an experienced engineer expects for this construction, sized from the part’s nominal values. You edit the draft before activating it.</Caption1>
            {create.error ? <MessageBar intent="error" role="alert"><MessageBarBody>{create.error.message}</MessageBarBody></MessageBar> : null}
            {templates.isPending ? <Loading /> : templates.error ? (
              <MessageBar intent="error"><MessageBarBody>{templates.error.message}</MessageBarBody></MessageBar>
            ) : (
              <RadioGroup aria-label="Template" value={value} onChange={(_, d) => setPicked(d.value)} className={s.group}>
                {items.map((t) => (
                  <div key={t.id} className={s.option}>
                    <Radio value={t.id} label={t.name} />
                    <Caption1 className={s.desc}>{t.description}</Caption1>
                  </div>
                ))}
              </RadioGroup>
            )}
          </DialogContent>
          <DialogActions>
            <Button className={s.touch} onClick={onClose}>Cancel</Button>
            <Button
              className={s.touch}
              appearance="primary"
              disabled={!value || create.isPending}
              onClick={async () => {
                const plan = await create.mutateAsync({ partId: part.id, template: value }).catch(() => null);
                if (plan) onCreated(plan);
              }}
            >
              {create.isPending ? 'Creating…' : 'Create draft'}
            </Button>
          </DialogActions>
        </DialogBody>
      </DialogSurface>
    </Dialog>
  );
}
