import { AsyncLocalStorage } from 'node:async_hooks';

/**
 * The time a change happens. Normally the wall clock; the demo seed replays six months of plant
 * history and runs each step "as of" its own date, so the records carry realistic times.
 */
const asOf = new AsyncLocalStorage<Date>();

export function now(): Date {
  return asOf.getStore() ?? new Date();
}

export function runAsOf<T>(when: Date, fn: () => Promise<T>): Promise<T> {
  return asOf.run(when, fn);
}
