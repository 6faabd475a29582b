import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationsListSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { invitationKeys } from './keys';

export function fetchInvitations(signal?: AbortSignal) {
  return apiClient.get('/api/invitations', { schema: invitationsListSchema, signal });
}

export function invitationsQueryOptions() {
  return queryOptions({
    queryKey: invitationKeys.list(),
    queryFn: ({ signal }) => fetchInvitations(signal),
    select: (body) => body.invitations,
  });
}

export function useInvitations(enabled = true) {
  return useQuery({ ...invitationsQueryOptions(), enabled });
}
