import { queryOptions, useQuery } from '@tanstack/react-query';
import { invitationPreviewSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { authKeys } from './keys';

export function fetchInvitationPreview(token: string, signal?: AbortSignal) {
  return apiClient.get(`/api/invitations/${encodeURIComponent(token)}`, {
    schema: invitationPreviewSchema,
    signal,
    redirectOnUnauthenticated: false,
  });
}

export function invitationPreviewQueryOptions(token: string) {
  return queryOptions({
    queryKey: authKeys.invitation(token),
    queryFn: ({ signal }) => fetchInvitationPreview(token, signal),
  });
}

export function useInvitationPreview(token: string) {
  return useQuery(invitationPreviewQueryOptions(token));
}
