import { BadRequestException, Injectable, PipeTransform } from '@nestjs/common';
import type { z } from 'zod';

/** Turns zod issues into `{ field: message }`, the `fields` of the error envelope. */
export function fieldsFromZod(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

export class ValidationFailed extends BadRequestException {
  constructor(public readonly fields: Record<string, string>, message = 'Some fields need attention') {
    super({ error: 'validation', message, fields });
  }
}

/** Validates one argument (body, query or params) with a schema from shared/. */
@Injectable()
export class ZodPipe<S extends z.ZodType> implements PipeTransform<unknown, z.infer<S>> {
  constructor(private readonly schema: S) {}
  transform(value: unknown): z.infer<S> {
    const parsed = this.schema.safeParse(value);
    if (!parsed.success) throw new ValidationFailed(fieldsFromZod(parsed.error));
    return parsed.data;
  }
}
