/** Query keys of the yard: lorries, drivers and the slot calendar. Invalidate by prefix. */
export const fleetKeys = {
  all: ['fleet'] as const,
  branches: () => [...fleetKeys.all, 'branches'] as const,
  lorries: (branchId: number) => [...fleetKeys.all, 'lorries', branchId] as const,
  /** Under `lorries(branchId)`, so invalidating a branch's lorries refetches this list too. */
  lorriesWithArchived: (branchId: number) => [...fleetKeys.lorries(branchId), 'with-archived'] as const,
  drivers: () => [...fleetKeys.all, 'drivers'] as const,
  slots: (branchId: number, date: string) => [...fleetKeys.all, 'slots', branchId, date] as const,
};
