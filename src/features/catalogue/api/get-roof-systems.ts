import { queryOptions, useQuery } from '@tanstack/react-query';
import { merchantRoofSystemListSchema } from '../../../../shared/schemas/price-list.schema';
import { apiClient } from '../../../lib/api-client';
import { catalogueKeys } from './keys';

export function fetchRoofSystems(branchId: number, signal?: AbortSignal) {
  return apiClient.get(`/api/roof-systems?branch_id=${branchId}`, { schema: merchantRoofSystemListSchema, signal }).then((r) => r.systems);
}

export const roofSystemsQuery = (branchId: number) => queryOptions({ queryKey: catalogueKeys.systemList(branchId), queryFn: ({ signal }) => fetchRoofSystems(branchId, signal) });

/** The roof systems a branch offers, each saying whether contractors can estimate with it now. */
export function useRoofSystems(branchId: number) {
  return useQuery(roofSystemsQuery(branchId));
}
