import { Body1, Button, Caption1, MessageBar, MessageBarBody, MessageBarTitle, Spinner, Subtitle2, makeStyles, mergeClasses, tokens } from '@fluentui/react-components';
import { useRef, useState } from 'react';
import { z } from 'zod';
import { STEP_INFO, reviewStepSchema, stepAnswerSchemas, type EightDStep, type ReviewStepInput, type Scar, type ScarStep } from '@shared/schemas/corrective-action';
import { Form } from '../../../components/form';
import { TextAreaField, formSchema } from '../../../components/form-fields';
import { evidenceUrl, usePutStep, useReviewStep, useUploadEvidence } from '../api/scars';
import { DueDate, StepStatusPill } from './scar-status';
import { AnswerView, NoAnswer, StepFields, cleanAnswer, initialAnswer } from './step-fields';
import { formatWhen } from '../../../lib/format';

const useStyles = makeStyles({
  card: { border: `1px solid ${tokens.colorNeutralStroke2}`, borderRadius: tokens.borderRadiusLarge, padding: '14px 16px', backgroundColor: tokens.colorNeutralBackground1, display: 'flex', flexDirection: 'column', gap: '10px' },
  locked: { padding: '8px 16px', gap: '4px', backgroundColor: tokens.colorNeutralBackground2 },
  open: { borderLeft: `4px solid ${tokens.colorPaletteMarigoldBorderActive}` },
  returned: { borderLeft: `4px solid ${tokens.colorPaletteRedBorder2}` },
  done: { borderLeft: `4px solid ${tokens.colorPaletteGreenBorder2}` },
  head: { display: 'flex', alignItems: 'center', gap: '10px', flexWrap: 'wrap' },
  step: { fontFamily: tokens.fontFamilyMonospace, fontWeight: 800, fontSize: tokens.fontSizeBase500, color: tokens.colorBrandForeground1 },
  grow: { flex: 1 },
  muted: { color: tokens.colorNeutralForeground3 },
  form: { display: 'flex', flexDirection: 'column', gap: '12px' },
  actions: { display: 'flex', gap: '8px', flexWrap: 'wrap', alignItems: 'center' },
  touch: { minHeight: '44px' },
  files: { margin: 0, padding: 0, listStyle: 'none', display: 'flex', flexDirection: 'column', gap: '4px' },
  link: { color: tokens.colorBrandForeground1, fontWeight: 600 },
  hidden: { display: 'none' },
  error: { color: tokens.colorPaletteRedForeground1 },
  review: { borderTop: `1px solid ${tokens.colorNeutralStroke2}`, paddingTop: '10px', display: 'flex', flexDirection: 'column', gap: '8px' },
});

const kb = (n: number) => (n < 1024 * 1024 ? `${Math.max(1, Math.round(n / 1024))} kB` : `${(n / 1024 / 1024).toFixed(1)} MB`);

function Evidence({ scar, step, canAdd }: { scar: Scar; step: ScarStep; canAdd: boolean }) {
  const s = useStyles();
  const upload = useUploadEvidence();
  const input = useRef<HTMLInputElement>(null);
  const [error, setError] = useState<string | null>(null);
  if (!step.evidence.length && !canAdd) return null;
  return (
    <div>
      <Caption1 className={s.muted} as="p" style={{ margin: '0 0 4px' }}>Evidence</Caption1>
      {step.evidence.length ? (
        <ul className={s.files}>
          {step.evidence.map((e) => (
            <li key={e.id}>
              <a className={s.link} href={evidenceUrl(scar.id, e.id)} target="_blank" rel="noreferrer">{e.name}</a> <Caption1 className={s.muted}>{e.contentType === 'application/pdf' ? 'PDF' : 'image'}, {kb(e.bytes)}</Caption1>
            </li>
          ))}
        </ul>
      ) : null}
      {canAdd ? (
        <div className={s.actions}>
          <Button className={s.touch} size="small" disabled={upload.isPending} onClick={() => input.current?.click()} aria-label={`Attach evidence to ${step.step}`}>Attach PDF or photo</Button>
          {upload.isPending ? <Spinner size="tiny" label="Uploading…" /> : null}
          <input
            ref={input}
            className={s.hidden}
            type="file"
            accept="application/pdf,image/jpeg,image/png,image/webp"
            aria-label={`Evidence file for ${step.step}`}
            onChange={(e) => {
              const file = e.target.files?.[0];
              e.target.value = '';
              if (!file) return;
              setError(null);
              upload.mutate({ id: scar.id, step: step.step, file }, { onError: (err) => setError(err.message) });
            }}
          />
          {error ? <Caption1 role="alert" className={s.error}>{error}</Caption1> : null}
        </div>
      ) : null}
    </div>
  );
}

interface AnswerValues {
  answer: Record<string, unknown>;
}
const lenient = z.object({ answer: z.record(z.string(), z.unknown()) });

/** The supplier's editor for one step: save a draft any time, submit when complete (checked in full). */
function StepEditor({ scar, step }: { scar: Scar; step: ScarStep }) {
  const s = useStyles();
  const put = usePutStep();
  const intent = useRef<'draft' | 'submit'>('draft');
  const [saved, setSaved] = useState<string | null>(null);
  return (
    <Form<AnswerValues>
      key={`${step.step}:${step.version}`}
      schema={formSchema<AnswerValues>(lenient)}
      defaultValues={{ answer: initialAnswer(step.step, step.draft ?? step.answer) }}
      className={s.form}
      aria-label={`Answer ${step.step} ${STEP_INFO[step.step].title}`}
      onSubmit={async (v, form) => {
        setSaved(null);
        const answer = cleanAnswer(step.step, v.answer);
        const submit = intent.current === 'submit';
        if (submit) {
          const r = stepAnswerSchemas[step.step as EightDStep].safeParse(answer);
          if (!r.success) {
            for (const issue of r.error.issues) form.setError(`answer.${issue.path.join('.')}` as never, { type: 'schema', message: issue.message });
            form.setError('root', { type: 'schema', message: `${step.step} is not complete yet: see the fields marked in red. Save it as a draft to finish later.` });
            return;
          }
        }
        await put.mutateAsync({ id: scar.id, step: step.step, answer, submit, version: step.version });
        setSaved(submit ? null : 'Draft saved. Only you see it until you submit.');
      }}
    >
      {(form) => (
        <>
          <StepFields step={step.step} />
          <div className={s.actions}>
            <Button className={s.touch} type="submit" disabled={form.formState.isSubmitting} onClick={() => (intent.current = 'draft')} aria-label={`Save ${step.step} as a draft`}>Save draft</Button>
            <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting} onClick={() => (intent.current = 'submit')} aria-label={`Submit ${step.step} for review`}>
              {form.formState.isSubmitting && intent.current === 'submit' ? 'Submitting…' : 'Submit for review'}
            </Button>
            {step.draftSavedAt ? <Caption1 className={s.muted}>Draft saved {formatWhen(step.draftSavedAt)}</Caption1> : null}
            {saved ? <Caption1 role="status">{saved}</Caption1> : null}
          </div>
        </>
      )}
    </Form>
  );
}

/** The engineer's accept / return, with the comment the supplier will read. */
function StepReview({ scar, step }: { scar: Scar; step: ScarStep }) {
  const s = useStyles();
  const review = useReviewStep();
  const decision = useRef<'accept' | 'return'>('accept');
  return (
    <Form<ReviewStepInput>
      key={`${step.step}:${step.version}`}
      schema={formSchema<ReviewStepInput>(reviewStepSchema)}
      defaultValues={{ decision: 'accept', comment: null, version: step.version }}
      className={s.review}
      aria-label={`Review ${step.step}`}
      onSubmit={async (v, form) => {
        if (decision.current === 'return' && !v.comment) {
          form.setError('comment', { type: 'schema', message: 'Say what the supplier must change' });
          return;
        }
        await review.mutateAsync({ id: scar.id, step: step.step, decision: decision.current, comment: v.comment ?? null, version: step.version });
      }}
    >
      {(form) => (
        <>
          <TextAreaField name="comment" label={`Comment on ${step.step} for the supplier`} hint="Needed when you return the answer; the supplier receives it by mail" rows={2} />
          <div className={s.actions}>
            <Button className={s.touch} appearance="primary" type="submit" disabled={form.formState.isSubmitting} onClick={() => (decision.current = 'accept', form.setValue('decision', 'accept'))}>Accept {step.step}</Button>
            <Button className={s.touch} type="submit" disabled={form.formState.isSubmitting} onClick={() => (decision.current = 'return', form.setValue('decision', 'return'))}>Return {step.step}</Button>
          </div>
        </>
      )}
    </Form>
  );
}

/**
 * One 8D step: its due date and state, what the engineer said when returning it, the answer (or
 * the supplier's editor when it is open), evidence, and the engineer's review when it waits.
 */
export function StepCard({ scar, step, role }: { scar: Scar; step: ScarStep; role: 'supplier' | 'engineer' | 'reader' }) {
  const s = useStyles();
  const info = STEP_INFO[step.step];
  const answerable = role === 'supplier' && scar.status !== 'closed' && (step.status === 'open' || step.status === 'returned');
  const done = step.status === 'submitted' || step.status === 'accepted';
  return (
    <section
      className={mergeClasses(s.card, step.status === 'returned' ? s.returned : step.status === 'accepted' ? s.done : step.status === 'open' ? s.open : step.status === 'locked' ? s.locked : undefined)}
      aria-label={`${step.step} ${info.title}`}
    >
      <div className={s.head}>
        <span className={s.step}>{step.step}</span>
        <Subtitle2 as="h3">{info.title}</Subtitle2>
        <StepStatusPill status={step.status} internal={role !== 'supplier'} />
        <span className={s.grow} />
        <DueDate dueOn={step.dueOn} overdue={step.overdue} done={done} />
      </div>
      {step.status !== 'locked' ? <Body1 className={s.muted}>{info.purpose}</Body1> : null}
      {step.status === 'returned' && step.reviewComment ? (
        <MessageBar intent="warning">
          <MessageBarBody>
            <MessageBarTitle>Returned by the engineer</MessageBarTitle>
            {step.reviewComment}
          </MessageBarBody>
        </MessageBar>
      ) : null}
      {step.status === 'accepted' && step.reviewComment ? <Caption1>Engineer: {step.reviewComment}</Caption1> : null}
      {answerable ? (
        <>
          {step.status === 'returned' && step.answer ? (
            <details>
              <summary>What you submitted before</summary>
              <AnswerView step={step.step} answer={step.answer} />
            </details>
          ) : null}
          <StepEditor scar={scar} step={step} />
        </>
      ) : step.answer ? (
        <AnswerView step={step.step} answer={step.answer} />
      ) : step.status === 'locked' ? (
        <Caption1 className={s.muted}>{step.step === 'D8' ? 'Opens once the engineer has accepted D1–D7.' : step.step === 'D4' ? 'Opens once the containment (D3) is submitted.' : 'Opens once the root cause (D4) is submitted.'}</Caption1>
      ) : (
        <NoAnswer />
      )}
      {step.submittedAt ? <Caption1 className={s.muted}>Submitted {formatWhen(step.submittedAt)}{step.reviewedAt ? ` · reviewed ${formatWhen(step.reviewedAt)}` : ''}</Caption1> : null}
      <Evidence scar={scar} step={step} canAdd={answerable} />
      {role === 'engineer' && step.status === 'submitted' && scar.status !== 'closed' ? <StepReview scar={scar} step={step} /> : null}
    </section>
  );
}
