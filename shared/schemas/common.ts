import { z } from 'zod';

/** The error envelope every API error uses. */
export const errorEnvelopeSchema = z.object({
  error: z.string(),
  message: z.string(),
  fields: z.record(z.string(), z.string()).optional(),
});
export type ErrorEnvelope = z.infer<typeof errorEnvelopeSchema>;

export const uuidSchema = z.uuid({ message: 'must be a valid id' });
export const idParamSchema = z.object({ id: uuidSchema });

/** Paging shared by every list: page from 1, at most 200 rows a page. */
export const pageQuerySchema = z.object({
  page: z.coerce.number().int().min(1, 'page starts at 1').default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'pageSize is at most 200').default(25),
  sort: z.string().max(64).optional(),
});
export type PageQuery = z.infer<typeof pageQuerySchema>;

export function pageOf<T extends z.ZodType>(item: T) {
  return z.object({ items: z.array(item), total: z.number().int().nonnegative() });
}

/** Trimmed, non-empty text of bounded length. */
export function text(max: number, label = 'this field') {
  return z
    .string({ message: `${label} must be text` })
    .trim()
    .min(1, `${label} is required`)
    .max(max, `${label} is at most ${max} characters`);
}
