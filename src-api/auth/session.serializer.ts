import { Injectable } from '@nestjs/common';
import { PassportSerializer } from '@nestjs/passport';
import { AuthService } from './auth.service';
import type { SessionUser } from '../../shared/schemas/auth';

/** The session stores only the user id; each request reloads the user so a deactivation takes effect at once. */
@Injectable()
export class SessionSerializer extends PassportSerializer {
  constructor(private readonly auth: AuthService) {
    super();
  }

  serializeUser(user: SessionUser, done: (err: unknown, id?: string) => void): void {
    done(null, user.id);
  }

  deserializeUser(id: string, done: (err: unknown, user?: SessionUser | false) => void): void {
    this.auth.sessionUser(id).then(
      (u) => done(null, u ?? false),
      (err: unknown) => done(err),
    );
  }
}
