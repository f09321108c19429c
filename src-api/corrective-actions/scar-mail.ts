import { publicLink, renderMail } from '../mail/mail-templates';
import type { MailDraft } from '../mail/outbox.service';
import { STEP_INFO, type EightDStep } from '../../shared/schemas/corrective-action';

/** The Supplier desk page of one corrective action: where every SCAR mail leads (through sign-in). */
export const deskPath = (id: string) => `/supplier-desk/corrective-actions/${id}`;

export interface ScarMailSubject {
  id: string;
  number: string;
  title: string;
  supplierName: string;
  recipients: string[];
}

const stepList = (steps: EightDStep[]) => steps.map((s) => `${s} ${STEP_INFO[s].title}`).join(', ');

export function issuedMail(
  publicUrl: string,
  s: ScarMailSubject,
  d: { ncrNumber: string; part: string | null; lot: string | null; defectCodes: string[]; suspectQuantity: number; problem: string; due: { containment: string; rootCause: string; closure: string } },
): MailDraft {
  const href = publicLink(publicUrl, deskPath(s.id));
  const body = renderMail({
    heading: `Corrective action requested: ${s.number}`,
    paragraphs: [
      `Harrowgate Drive Systems asks ${s.supplierName} for a corrective action, answered in the 8D steps, for nonconformance ${d.ncrNumber}: ${s.title}.`,
      `Please contain first: the containment (D1–D3) is due ${d.due.containment}.`,
    ],
    facts: [
      ['Request', s.number],
      ['Nonconformance', d.ncrNumber],
      ['Part', d.part ?? '—'],
      ['Lot', d.lot ?? '—'],
      ['Defect', d.defectCodes.join(', ') || '—'],
      ['Suspect quantity', String(d.suspectQuantity)],
      ['Containment (D1–D3) due', d.due.containment],
      ['Root cause and plan (D4–D5) due', d.due.rootCause],
      ['Closure (D6–D8) due', d.due.closure],
    ],
    quote: { label: 'The problem', text: d.problem },
    link: { href, label: 'Open the request on the Supplier desk' },
  });
  return { kind: 'scar-issued', to: s.recipients, subject: `${s.number} corrective action requested: ${s.title}`, ...body, entity: 'corrective_action', entityId: s.id };
}

export function returnedMail(publicUrl: string, s: ScarMailSubject, steps: EightDStep[], comment: string, reopened = false): MailDraft {
  const href = publicLink(publicUrl, deskPath(s.id));
  const body = renderMail({
    heading: reopened ? `${s.number} reopened: the defect returned` : `${s.number}: ${stepList(steps)} returned`,
    paragraphs: [
      reopened
        ? `The same defect was found again, so the corrective action ${s.number} (${s.title}) is reopened. Please answer ${stepList(steps)} again.`
        : `The quality engineer has returned your answer to ${stepList(steps)} of ${s.number} (${s.title}). Please revise it and submit it again.`,
    ],
    quote: { label: reopened ? 'Why it was reopened' : 'What to change', text: comment },
    link: { href, label: 'Revise the answer on the Supplier desk' },
  });
  return { kind: 'step-returned', to: s.recipients, subject: reopened ? `${s.number} reopened: the defect returned` : `${s.number} ${steps.join(', ')} returned: please revise`, ...body, entity: 'corrective_action', entityId: s.id };
}

export function dueMail(publicUrl: string, s: ScarMailSubject, kind: 'due-reminder' | 'overdue', steps: EightDStep[], dueOn: string): MailDraft {
  const href = publicLink(publicUrl, deskPath(s.id));
  const reminder = kind === 'due-reminder';
  const body = renderMail({
    heading: reminder ? `${s.number}: ${stepList(steps)} due ${dueOn}` : `${s.number}: ${stepList(steps)} overdue`,
    paragraphs: [
      reminder
        ? `A reminder: ${stepList(steps)} of ${s.number} (${s.title}) ${steps.length > 1 ? 'are' : 'is'} due on ${dueOn}, the next working day.`
        : `${stepList(steps)} of ${s.number} (${s.title}) ${steps.length > 1 ? 'were' : 'was'} due on ${dueOn} and ${steps.length > 1 ? 'have' : 'has'} not been submitted.`,
    ],
    facts: [
      ['Request', s.number],
      ['Due', dueOn],
    ],
    link: { href, label: 'Answer on the Supplier desk' },
  });
  return {
    kind,
    to: s.recipients,
    subject: reminder ? `${s.number} ${steps.join(', ')} due ${dueOn}` : `${s.number} ${steps.join(', ')} overdue since ${dueOn}`,
    ...body,
    entity: 'corrective_action',
    entityId: s.id,
    dedupeKey: `${kind}:${s.id}:${dueOn}:${steps.join(',')}`,
  };
}
