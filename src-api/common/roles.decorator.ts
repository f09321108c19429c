import { SetMetadata } from '@nestjs/common';
import type { Role } from '../../shared/schemas/auth';

/** Pseudo-role for routes anyone may call (health, sign-in, CSRF token). */
export const PUBLIC = 'public' as const;
export type Access = Role | typeof PUBLIC;
export const ROLES_KEY = 'yokeline:roles';

export const SIGNED_IN: Role[] = ['inspector', 'engineer', 'supplier', 'auditor', 'admin'];
export const INTERNAL_READ: Role[] = ['inspector', 'engineer', 'auditor', 'admin'];

/**
 * Every route names who may call it. The guard refuses a route that names nobody
 * (deny by default), and a test walks every route to prove each one declares its roles.
 */
export const Roles = (...roles: Access[]) => SetMetadata(ROLES_KEY, roles);
