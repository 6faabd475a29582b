// zod/mini: the sign-in page checks its form with these schemas before the rest of the app (and zod's
// classic API) has loaded, so they stay out of the classic API's code (DEVELOPERS.md, decision 34).
import './zod-messages';
import * as z from 'zod/mini';
import { ORGANISATION_KINDS, ROLES } from '../domain/roles';

export const emailSchema = z.pipe(z.string().check(z.trim(), z.toLowerCase(), z.maxLength(254, 'An e-mail address has at most 254 characters')), z.email({ message: 'Enter a valid e-mail address' }));

export const passwordSchema = z.string().check(z.minLength(10, 'Use at least 10 characters'), z.maxLength(200, 'Use at most 200 characters'));

export const personNameSchema = z.string().check(z.trim(), z.minLength(1, 'Enter a name'), z.maxLength(120, 'At most 120 characters'));

export const loginBodySchema = z.object({
  email: emailSchema,
  password: z.string().check(z.minLength(1, 'Enter your password'), z.maxLength(200)),
});

export const signupBodySchema = z.object({
  organisation_name: z.string().check(z.trim(), z.minLength(2, 'Enter the firm’s name'), z.maxLength(120)),
  kind: z.enum(ORGANISATION_KINDS),
  name: personNameSchema,
  email: emailSchema,
  password: passwordSchema,
});

export const forgotPasswordBodySchema = z.object({ email: emailSchema });

export const resetPasswordBodySchema = z.object({
  token: z.string().check(z.minLength(20), z.maxLength(200)),
  password: passwordSchema,
});

export const acceptInvitationBodySchema = z.object({
  name: personNameSchema,
  password: passwordSchema,
});

export const sessionUserSchema = z.object({
  id: z.int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
});

export const sessionOrganisationSchema = z.object({
  id: z.int(),
  name: z.string(),
  kind: z.enum(ORGANISATION_KINDS),
});

/** The firm's calendar as the server sees it: the browser works out "today" in the same time zone. */
export const sessionCalendarSchema = z.object({
  time_zone: z.string(),
  today: z.string(),
});

/** Body of POST /api/auth/login, POST /api/auth/signup, GET /api/auth/me and accepting an invitation. */
export const sessionBodySchema = z.object({
  user: sessionUserSchema,
  organisation: sessionOrganisationSchema,
  calendar: sessionCalendarSchema,
  /** ISO 4217 code of the currency every amount is kept in (minor units) and shown in: the server's CURRENCY. */
  currency: z.string().check(z.regex(/^[A-Z]{3}$/)),
});

/** Who is signed in: the session, or null when nobody is. */
export const sessionAnswerSchema = z.object({ session: z.nullable(sessionBodySchema) });

export const csrfBodySchema = z.object({ token: z.string() });
export const okBodySchema = z.object({ ok: z.literal(true) });

export type LoginBody = z.infer<typeof loginBodySchema>;
export type SignupBody = z.infer<typeof signupBodySchema>;
export type SessionBody = z.infer<typeof sessionBodySchema>;
export type SessionUser = z.infer<typeof sessionUserSchema>;
