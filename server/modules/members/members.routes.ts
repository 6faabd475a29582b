import { createInvitationBodySchema, idParamsSchema, updateMemberBodySchema } from '../../../shared/schemas/members.schema';
import { currentUser } from '../../auth/policy';
import { apiRouter } from '../../http/endpoint';
import type { MembersService } from './members.service';

export function membersRoutes(members: MembersService) {
  const r = apiRouter();

  r.get('/members', { access: { action: 'members:read' } }, async (req, res) => {
    res.json({ members: await members.list(currentUser(req)) });
  });

  r.patch('/members/:id', { access: { action: 'members:manage' }, params: idParamsSchema, body: updateMemberBodySchema }, async (req, res, { params, body }) => {
    res.json(await members.changeRole(currentUser(req), params.id, body.role));
  });

  r.delete('/members/:id', { access: { action: 'members:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    await members.remove(currentUser(req), params.id);
    res.status(204).end();
  });

  r.get('/invitations', { access: { action: 'members:manage' } }, async (req, res) => {
    res.json({ invitations: await members.listInvitations(currentUser(req)) });
  });

  r.post('/invitations', { access: { action: 'members:manage' }, body: createInvitationBodySchema }, async (req, res, { body }) => {
    res.status(201).json(await members.invite(currentUser(req), body.email, body.role));
  });

  r.delete('/invitations/:id', { access: { action: 'members:manage' }, params: idParamsSchema }, async (req, res, { params }) => {
    await members.revokeInvitation(currentUser(req), params.id);
    res.status(204).end();
  });

  return r.router;
}
