import { CanActivate, ExecutionContext, ForbiddenException, Injectable, UnauthorizedException } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { Request } from 'express';
import { PUBLIC, ROLES_KEY, type Access } from './roles.decorator';
import type { SessionUser } from '../../shared/schemas/auth';

@Injectable()
export class RolesGuard implements CanActivate {
  constructor(private readonly reflector: Reflector) {}

  canActivate(ctx: ExecutionContext): boolean {
    const roles = this.reflector.getAllAndOverride<Access[] | undefined>(ROLES_KEY, [ctx.getHandler(), ctx.getClass()]);
    if (!roles || roles.length === 0) {
      // Deny by default: a route that forgot to declare its roles is closed to everyone.
      throw new ForbiddenException('This route declares no roles and is closed');
    }
    if (roles.includes(PUBLIC)) return true;
    const req = ctx.switchToHttp().getRequest<Request>();
    const user = req.user as SessionUser | undefined;
    if (!user) throw new UnauthorizedException('Sign in first');
    if (!roles.includes(user.role)) throw new ForbiddenException('Your role may not do this');
    return true;
  }
}
