import { z } from 'zod';
import { ORGANISATION_KINDS, ROLES } from '../domain/roles';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .max(254, 'An e-mail address has at most 254 characters')
  .pipe(z.email({ message: 'Enter a valid e-mail address' }));

export const passwordSchema = z.string().min(10, 'Use at least 10 characters').max(200, 'Use at most 200 characters');

export const personNameSchema = z.string().trim().min(1, 'Enter a name').max(120, 'At most 120 characters');

export const loginBodySchema = z.object({
  email: emailSchema,
  password: z.string().min(1, 'Enter your password').max(200),
});

export const signupBodySchema = z.object({
  organisation_name: z.string().trim().min(2, 'Enter the firm’s name').max(120),
  kind: z.enum(ORGANISATION_KINDS),
  name: personNameSchema,
  email: emailSchema,
  password: passwordSchema,
});

export const forgotPasswordBodySchema = z.object({ email: emailSchema });

export const resetPasswordBodySchema = z.object({
  token: z.string().min(20).max(200),
  password: passwordSchema,
});

export const acceptInvitationBodySchema = z.object({
  name: personNameSchema,
  password: passwordSchema,
});

export const sessionUserSchema = z.object({
  id: z.number().int(),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
});

export const sessionOrganisationSchema = z.object({
  id: z.number().int(),
  name: z.string(),
  kind: z.enum(ORGANISATION_KINDS),
});

/** Body of POST /api/auth/login, POST /api/auth/signup, GET /api/auth/me and accepting an invitation. */
/** The firm's calendar as the server sees it: the browser works out "today" in the same time zone. */
export const sessionCalendarSchema = z.object({
  time_zone: z.string(),
  today: z.string(),
});

export const sessionBodySchema = z.object({
  user: sessionUserSchema,
  organisation: sessionOrganisationSchema,
  calendar: sessionCalendarSchema,
  /** ISO 4217 code of the currency every amount is kept in (minor units) and shown in: the server's CURRENCY. */
  currency: z.string().regex(/^[A-Z]{3}$/),
});

/** Who is signed in: the session, or null when nobody is. */
export const sessionAnswerSchema = z.object({ session: sessionBodySchema.nullable() });

export const csrfBodySchema = z.object({ token: z.string() });
export const okBodySchema = z.object({ ok: z.literal(true) });

export type LoginBody = z.infer<typeof loginBodySchema>;
export type SignupBody = z.infer<typeof signupBodySchema>;
export type SessionBody = z.infer<typeof sessionBodySchema>;
export type SessionUser = z.infer<typeof sessionUserSchema>;
