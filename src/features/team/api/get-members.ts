import { queryOptions, useQuery } from '@tanstack/react-query';
import { membersListSchema } from '../../../../shared/schemas/members.schema';
import { apiClient } from '../../../lib/api-client';
import { memberKeys } from './keys';

export function fetchMembers(signal?: AbortSignal) {
  return apiClient.get('/api/members', { schema: membersListSchema, signal });
}

export function membersQueryOptions() {
  return queryOptions({
    queryKey: memberKeys.list(),
    queryFn: ({ signal }) => fetchMembers(signal),
    select: (body) => body.members,
  });
}

export function useMembers() {
  return useQuery(membersQueryOptions());
}
