import { createParamDecorator, ExecutionContext, UnauthorizedException } from '@nestjs/common';
import type { Request } from 'express';
import type { SessionUser } from '../../shared/schemas/auth';

/** The signed-in user. The roles guard has already refused anonymous callers. */
export const CurrentUser = createParamDecorator((_: unknown, ctx: ExecutionContext): SessionUser => {
  const req = ctx.switchToHttp().getRequest<Request>();
  if (!req.user) throw new UnauthorizedException('Sign in first');
  return req.user as SessionUser;
});
