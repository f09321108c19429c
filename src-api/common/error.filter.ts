import { ArgumentsHost, Catch, ExceptionFilter, HttpException, HttpStatus, Logger } from '@nestjs/common';
import type { Request, Response } from 'express';
import { ZodError } from 'zod';
import { fieldsFromZod } from './zod.pipe';

const CODES: Record<number, string> = {
  400: 'validation',
  401: 'unauthenticated',
  403: 'forbidden',
  404: 'not_found',
  405: 'method_not_allowed',
  409: 'conflict',
  413: 'too_large',
  415: 'unsupported_media_type',
  422: 'unprocessable',
  429: 'too_many_requests',
  503: 'unavailable',
};

interface Envelope {
  error: string;
  message: string;
  fields?: Record<string, string>;
}

/** The one place errors become `{ error, message, fields? }`. */
@Catch()
export class ErrorFilter implements ExceptionFilter {
  private readonly log = new Logger('ErrorFilter');

  catch(exception: unknown, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    const req = host.switchToHttp().getRequest<Request>();
    const { status, body } = this.toEnvelope(exception, req);
    if (status >= 500) this.log.error({ err: exception, path: req.path }, 'request failed');
    if (res.headersSent) return;
    res.status(status).json(body);
  }

  toEnvelope(exception: unknown, req?: Request): { status: number; body: Envelope } {
    const e = exception as { code?: string; status?: number; type?: string; statusCode?: number; name?: string };
    if (e && e.code === 'EBADCSRFTOKEN') {
      return { status: 403, body: { error: 'csrf', message: 'The security token is missing or stale. Reload the page and try again.' } };
    }
    if (exception instanceof ZodError) {
      return { status: 400, body: { error: 'validation', message: 'Some fields need attention', fields: fieldsFromZod(exception) } };
    }
    if (exception instanceof HttpException) {
      const status = exception.getStatus();
      const r = exception.getResponse();
      if (typeof r === 'object' && r !== null) {
        const o = r as Record<string, unknown>;
        const message = Array.isArray(o.message) ? o.message.join('; ') : String(o.message ?? exception.message);
        const body: Envelope = {
          error: typeof o.error === 'string' && /^[a-z_]+$/.test(o.error) ? o.error : (CODES[status] ?? 'error'),
          message,
        };
        if (o.fields && typeof o.fields === 'object') body.fields = o.fields as Record<string, string>;
        return { status, body };
      }
      return { status, body: { error: CODES[status] ?? 'error', message: String(r) } };
    }
    // body-parser: malformed JSON, too large, wrong charset.
    if (e && e.type === 'entity.parse.failed') {
      return { status: 400, body: { error: 'validation', message: 'The request body is not valid JSON' } };
    }
    if (e && e.type === 'entity.too.large') {
      return { status: 413, body: { error: 'too_large', message: 'The request body is too large' } };
    }
    if (e && typeof e.status === 'number' && e.status >= 400 && e.status < 500) {
      return { status: e.status, body: { error: CODES[e.status] ?? 'error', message: 'The request could not be read' } };
    }
    // Database unreachable → 503 so clients retry rather than give up.
    if (e && typeof e.code === 'string' && /^(ECONNREFUSED|57P01|57P03|08006|08001|08003)$/.test(e.code)) {
      return { status: 503, body: { error: 'unavailable', message: 'The database is not reachable right now. Try again shortly.' } };
    }
    void req;
    return { status: HttpStatus.INTERNAL_SERVER_ERROR, body: { error: 'internal', message: 'Something went wrong on our side. The error was logged.' } };
  }
}
