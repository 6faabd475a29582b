import type { Request } from 'express';
import type { SessionBody } from '../../shared/schemas/auth.schema';
import type { Config } from '../config/env';
import type { AuthUser } from './auth-user';

/** Who is signed in, and the firm-wide settings every page works in: the calendar and the currency. */
export function sessionBody(user: AuthUser, { calendar, currency }: Pick<Config, 'calendar' | 'currency'>): SessionBody {
  return {
    user: { id: user.id, email: user.email, name: user.name, role: user.role },
    organisation: user.organisation,
    calendar: { time_zone: calendar.timeZone, today: calendar.today() },
    currency,
  };
}

/** Signs the user in; passport regenerates the session id so a planted id is worthless. */
export function logIn(req: Request, user: AuthUser): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}

export function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
}
