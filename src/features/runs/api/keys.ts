/** Query keys of the yard's runs: the day plan, the week, one run and one pallet. Invalidate by prefix. */
export const runKeys = {
  all: ['runs'] as const,
  days: () => [...runKeys.all, 'day'] as const,
  day: (branchId: number, date: string) => [...runKeys.days(), branchId, date] as const,
  weeks: () => [...runKeys.all, 'week'] as const,
  week: (branchId: number, from: string) => [...runKeys.weeks(), branchId, from] as const,
  details: () => [...runKeys.all, 'detail'] as const,
  detail: (runId: number) => [...runKeys.details(), runId] as const,
  pallets: () => [...runKeys.all, 'pallet'] as const,
  pallet: (orderId: number, pallet: number) => [...runKeys.pallets(), orderId, pallet] as const,
};
