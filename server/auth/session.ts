import type { Request } from 'express';
import type { SessionBody } from '../../shared/schemas/auth.schema';
import type { BusinessCalendar } from '../../shared/domain/business-calendar';
import type { AuthUser } from './auth-user';

export function sessionBody(user: AuthUser, calendar: BusinessCalendar): SessionBody {
  return {
    user: { id: user.id, email: user.email, name: user.name, role: user.role },
    organisation: user.organisation,
    calendar: { time_zone: calendar.timeZone, today: calendar.today() },
  };
}

/** Signs the user in; passport regenerates the session id so a planted id is worthless. */
export function logIn(req: Request, user: AuthUser): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, (err) => (err ? reject(err) : resolve())));
}

export function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logOut((err) => (err ? reject(err) : resolve())));
}
