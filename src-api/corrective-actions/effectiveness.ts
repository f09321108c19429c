import { and, arrayOverlaps, eq, inArray, isNull } from 'drizzle-orm';
import type { Tx } from '../db/client';
import { correctiveAction } from '../db/schema';
import { AuditRepository } from '../audit/audit.repository';
import { now } from '../common/clock';

/**
 * Effectiveness of corrective actions (ISO 9001 §10.2.1 d): once the supplier's actions are
 * accepted, the request waits in "verifying" until the next N lots of that supplier × part pass
 * without the same defect. These two hooks feed it, each inside the caller's transaction.
 */
const audit = new AuditRepository();

interface Actor {
  id: string;
  email: string;
}

/**
 * Called by LotsService.decide for every lot decision. An accepted lot counts towards the
 * verification of the supplier × part's requests in "verifying". A rejected lot does not count;
 * if its NCR names the same defect, noteNcrForCorrectiveActions marks the recurrence.
 */
export async function recordLotDecisionForCorrectiveActions(tx: Tx, l: { id: string; supplierId: string; partId: string }, accepted: boolean, actor: Actor | null): Promise<void> {
  if (!accepted) return;
  const rows = await tx
    .select()
    .from(correctiveAction)
    .where(and(eq(correctiveAction.supplierId, l.supplierId), eq(correctiveAction.partId, l.partId), eq(correctiveAction.status, 'verifying')))
    .for('update');
  for (const ca of rows) {
    if (ca.verifyLots.some((x) => x.lotId === l.id)) continue;
    const verifyLots = [...ca.verifyLots, { lotId: l.id, at: now().toISOString() }];
    await tx.update(correctiveAction).set({ verifyLots, version: ca.version + 1, updatedAt: now() }).where(eq(correctiveAction.id, ca.id));
    await audit.record(tx, {
      actorId: actor?.id ?? null,
      actorEmail: actor?.email ?? null,
      action: 'corrective_action.verification_lot',
      entity: 'corrective_action',
      entityId: ca.id,
      after: { lotId: l.id, passed: verifyLots.length, required: ca.verifyLotsRequired },
    });
  }
}

/**
 * Called when an NCR is raised or its defect codes change: the same defect on the same
 * supplier × part while a request is accepted or verifying means the defect has returned. The
 * request is flagged (it cannot be closed) and the engineer reopens it.
 */
export async function noteNcrForCorrectiveActions(
  tx: Tx,
  n: { id: string; number: string; lotId: string | null; supplierId: string | null; partId: string | null; defectCodes: string[] },
  actor: Actor | null,
): Promise<string[]> {
  if (!n.supplierId || !n.partId || !n.defectCodes.length) return [];
  const rows = await tx
    .select()
    .from(correctiveAction)
    .where(
      and(
        eq(correctiveAction.supplierId, n.supplierId),
        eq(correctiveAction.partId, n.partId),
        inArray(correctiveAction.status, ['accepted', 'verifying']),
        arrayOverlaps(correctiveAction.defectCodes, n.defectCodes),
        isNull(correctiveAction.recurrenceNcrId),
      ),
    )
    .for('update');
  const flagged: string[] = [];
  for (const ca of rows) {
    if (ca.ncrId === n.id) continue;
    await tx.update(correctiveAction).set({ recurrenceNcrId: n.id, recurrenceLotId: n.lotId, recurrenceAt: now(), version: ca.version + 1, updatedAt: now() }).where(eq(correctiveAction.id, ca.id));
    await audit.record(tx, {
      actorId: actor?.id ?? null,
      actorEmail: actor?.email ?? null,
      action: 'corrective_action.recurrence',
      entity: 'corrective_action',
      entityId: ca.id,
      after: { ncr: n.number, lotId: n.lotId, defectCodes: n.defectCodes.filter((c) => ca.defectCodes.includes(c)) },
      reason: `The defect returned in ${n.number}`,
    });
    flagged.push(ca.id);
  }
  return flagged;
}
