import { createHash } from 'node:crypto';

/** JSON with object keys sorted at every level: the same content always hashes the same. */
export function canonicalJson(v: unknown): string {
  if (v === null || v === undefined) return 'null';
  if (v instanceof Date) return JSON.stringify(v.toISOString());
  if (Array.isArray(v)) return `[${v.map(canonicalJson).join(',')}]`;
  if (typeof v === 'object') {
    const o = v as Record<string, unknown>;
    const keys = Object.keys(o).filter((k) => o[k] !== undefined).sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`).join(',')}}`;
  }
  if (typeof v === 'number' && !Number.isFinite(v)) return 'null';
  return JSON.stringify(v);
}

export interface ChainedContent {
  actorId: string | null;
  actorEmail: string | null;
  at: Date;
  action: string;
  entity: string;
  entityId: string;
  before: unknown;
  after: unknown;
  reason: string | null;
}

/** hash = SHA-256(prevHash ‖ canonical content); the first row chains from the empty string. */
export function chainHash(prevHash: string | null, c: ChainedContent): string {
  const body = canonicalJson({ ...c, at: c.at.toISOString(), before: c.before ?? null, after: c.after ?? null });
  return createHash('sha256').update(`${prevHash ?? ''}\n${body}`).digest('hex');
}
