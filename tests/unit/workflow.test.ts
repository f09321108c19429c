import { describe, expect, it } from 'vitest';
import {
  EIGHT_D_STEPS, NCR_MANUAL_TRANSITIONS, NCR_STATUSES, NCR_TRANSITIONS, SCAR_MANUAL_TRANSITIONS, SCAR_STATUSES, SCAR_TRANSITIONS,
  derivedScarStatus, milestoneOf, scarPath, stepOpens, type EightDStep, type StepStatus,
} from '../../shared/compute/workflow';

const steps = (m: Partial<Record<EightDStep, StepStatus>>) => EIGHT_D_STEPS.map((step) => ({ step, status: m[step] ?? 'open' }));

describe('state tables', () => {
  it('allow only moves the full tables allow, and end in closed', () => {
    for (const s of NCR_STATUSES) for (const to of NCR_MANUAL_TRANSITIONS[s]) expect(NCR_TRANSITIONS[s]).toContain(to);
    for (const s of SCAR_STATUSES) for (const to of SCAR_MANUAL_TRANSITIONS[s]) expect(SCAR_TRANSITIONS[s]).toContain(to);
    expect(NCR_TRANSITIONS.closed).toEqual([]);
    expect(SCAR_TRANSITIONS.closed).toEqual([]);
  });

  it('reach every state from the first', () => {
    const reach = (start: string, table: Record<string, readonly string[]>) => {
      const seen = new Set([start]);
      const queue = [start];
      while (queue.length) {
        for (const n of table[queue.shift()!]) {
          if (seen.has(n)) continue;
          seen.add(n);
          queue.push(n);
        }
      }
      return seen;
    };
    expect([...reach('open', NCR_TRANSITIONS)].sort()).toEqual([...NCR_STATUSES].sort());
    expect([...reach('issued', SCAR_TRANSITIONS)].sort()).toEqual([...SCAR_STATUSES].sort());
  });
});

describe('derivedScarStatus', () => {
  it('follows the 8D milestones as steps come in', () => {
    expect(derivedScarStatus('issued', steps({}), false)).toBe('issued');
    expect(derivedScarStatus('issued', steps({}), true)).toBe('acknowledged');
    expect(derivedScarStatus('issued', steps({ D1: 'submitted' }), false)).toBe('acknowledged');
    expect(derivedScarStatus('acknowledged', steps({ D3: 'submitted' }), true)).toBe('containment-in');
    expect(derivedScarStatus('containment-in', steps({ D3: 'accepted', D4: 'submitted' }), true)).toBe('root-cause-in');
    expect(derivedScarStatus('root-cause-in', steps({ D3: 'accepted', D4: 'submitted', D5: 'submitted', D6: 'submitted' }), true)).toBe('root-cause-in');
    expect(derivedScarStatus('root-cause-in', steps({ D3: 'accepted', D4: 'submitted', D5: 'submitted', D6: 'submitted', D7: 'submitted' }), true)).toBe('actions-in');
    const all = { D1: 'accepted', D2: 'accepted', D3: 'accepted', D4: 'accepted', D5: 'accepted', D6: 'accepted', D7: 'accepted' } as const;
    expect(derivedScarStatus('actions-in', steps(all), true)).toBe('accepted');
  });

  it('is returned while any D1–D7 answer is sent back, and leaves verifying and closed alone', () => {
    expect(derivedScarStatus('root-cause-in', steps({ D3: 'accepted', D4: 'returned' }), true)).toBe('returned');
    expect(derivedScarStatus('returned', steps({ D3: 'accepted', D4: 'submitted' }), true)).toBe('root-cause-in');
    expect(derivedScarStatus('verifying', steps({ D4: 'returned' }), true)).toBe('verifying');
    expect(derivedScarStatus('accepted', steps({ D1: 'accepted', D2: 'accepted', D3: 'accepted', D4: 'accepted', D5: 'accepted', D6: 'accepted', D7: 'accepted', D8: 'returned' }), true)).toBe('accepted');
    expect(milestoneOf(steps({ D3: 'returned' }), true)).toBe('containment-in');
  });
});

describe('scarPath', () => {
  it('passes through every milestone on the way, one legal edge at a time', () => {
    expect(scarPath('issued', 'containment-in')).toEqual(['acknowledged', 'containment-in']);
    expect(scarPath('returned', 'actions-in')).toEqual(['actions-in']);
    expect(scarPath('actions-in', 'actions-in')).toEqual([]);
    expect(() => scarPath('closed', 'issued')).toThrow(/cannot move/);
    expect(() => scarPath('verifying', 'accepted')).toThrow(/cannot move/);
  });
});

describe('stepOpens', () => {
  it('opens containment at once, root cause after containment, actions after root cause, closure after acceptance', () => {
    const fresh = steps({ D4: 'locked', D5: 'locked', D6: 'locked', D7: 'locked', D8: 'locked' });
    expect(['D1', 'D2', 'D3'].every((s) => stepOpens(s as EightDStep, fresh, 'issued'))).toBe(true);
    expect(stepOpens('D4', fresh, 'issued')).toBe(false);
    expect(stepOpens('D4', steps({ D3: 'submitted' }), 'containment-in')).toBe(true);
    expect(stepOpens('D6', steps({ D3: 'submitted' }), 'containment-in')).toBe(false);
    expect(stepOpens('D6', steps({ D4: 'returned' }), 'returned')).toBe(true);
    expect(stepOpens('D8', fresh, 'actions-in')).toBe(false);
    expect(stepOpens('D8', fresh, 'verifying')).toBe(true);
    expect(stepOpens('D1', fresh, 'closed')).toBe(false);
  });
});
