import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { generateSlotsResultSchema, slotSchema } from '../../../../shared/schemas/slot.schema';
import type { createSlotBodySchema, generateSlotsBodySchema } from '../../../../shared/schemas/slot.schema';
import { apiClient } from '../../../lib/api-client';
import { fleetKeys } from './keys';

export type CreateSlotBody = z.input<typeof createSlotBodySchema>;
export type GenerateSlotsBody = z.input<typeof generateSlotsBodySchema>;

export function createSlot(branchId: number, body: CreateSlotBody) {
  return apiClient.post(`/api/branches/${branchId}/slots`, { body, schema: slotSchema });
}

export function generateSlots(branchId: number, body: GenerateSlotsBody) {
  return apiClient.post(`/api/branches/${branchId}/slots/generate`, { body, schema: generateSlotsResultSchema });
}

function useSlotMutation<TVars, TResult>(branchId: number, mutationFn: (vars: TVars) => Promise<TResult>) {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn, onSuccess: () => queryClient.invalidateQueries({ queryKey: [...fleetKeys.all, 'slots', branchId] }) });
}

export function useCreateSlot(branchId: number) {
  return useSlotMutation(branchId, (body: CreateSlotBody) => createSlot(branchId, body));
}

export function useGenerateSlots(branchId: number) {
  return useSlotMutation(branchId, (body: GenerateSlotsBody) => generateSlots(branchId, body));
}
