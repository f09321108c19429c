import { ExecutionContext, Injectable } from '@nestjs/common';
import { AuthGuard } from '@nestjs/passport';
import type { Request } from 'express';
import { loginSchema } from '../../shared/schemas/auth';
import { fieldsFromZod, ValidationFailed } from '../common/zod.pipe';

/**
 * Validates the body with the shared schema first (guards run before pipes), then lets
 * passport-local check the password and start the session. passport 0.7 regenerates the
 * session id on login, so a fixated id is never carried over.
 */
@Injectable()
export class LoginGuard extends AuthGuard('local') {
  override async canActivate(ctx: ExecutionContext): Promise<boolean> {
    const req = ctx.switchToHttp().getRequest<Request>();
    const parsed = loginSchema.safeParse(req.body);
    if (!parsed.success) throw new ValidationFailed(fieldsFromZod(parsed.error));
    req.body = parsed.data;
    const ok = (await super.canActivate(ctx)) as boolean;
    await super.logIn(req);
    return ok;
  }
}
