import './zod-messages';
import * as z from 'zod/mini';
import { ROLES } from '../domain/roles';
import { emailSchema } from './auth.schema';

export const idParamsSchema = z.object({ id: z.coerce.number().check(z.int(), z.positive()) });
export const tokenParamsSchema = z.object({ token: z.string().check(z.minLength(20), z.maxLength(200)) });

export const memberSchema = z.object({
  id: z.number().check(z.int()),
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  created_at: z.string(),
});
export const membersListSchema = z.object({ members: z.array(memberSchema) });

export const updateMemberBodySchema = z.object({ role: z.enum(ROLES) });

export const createInvitationBodySchema = z.object({
  email: emailSchema,
  role: z.enum(ROLES),
});

export const invitationSchema = z.object({
  id: z.number().check(z.int()),
  email: z.string(),
  role: z.enum(ROLES),
  expires_at: z.string(),
  created_at: z.string(),
});
export const invitationsListSchema = z.object({ invitations: z.array(invitationSchema) });

/** What the accept-invitation page may show before the person signs up. */
export const invitationPreviewSchema = z.object({
  email: z.string(),
  role: z.enum(ROLES),
  organisation: z.object({ name: z.string(), kind: z.enum(['contractor', 'merchant']) }),
});

export const branchSchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  address: z.string(),
  town: z.string(),
  phone: z.nullable(z.string()),
});

export const organisationSchema = z.object({
  id: z.number().check(z.int()),
  name: z.string(),
  kind: z.enum(['contractor', 'merchant']),
  branches: z.array(branchSchema),
});

export const outboxMessageSchema = z.object({
  id: z.number().check(z.int()),
  from: z.string(),
  to: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.nullable(z.string()),
  created_at: z.string(),
});
export const outboxListSchema = z.object({ messages: z.array(outboxMessageSchema) });

export type Member = z.infer<typeof memberSchema>;
export type Invitation = z.infer<typeof invitationSchema>;
export type Organisation = z.infer<typeof organisationSchema>;
export type OutboxMessage = z.infer<typeof outboxMessageSchema>;
