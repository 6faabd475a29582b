/** Query keys of the desk's quote requests: the requests sent to the merchant's branches, and a branch's stock to price from. */
export const quoteDeskKeys = {
  all: ['quote-desk'] as const,
  lists: () => [...quoteDeskKeys.all, 'list'] as const,
  list: () => [...quoteDeskKeys.lists(), {}] as const,
  details: () => [...quoteDeskKeys.all, 'detail'] as const,
  detail: (id: number) => [...quoteDeskKeys.details(), id] as const,
  stock: (branchId: number) => [...quoteDeskKeys.all, 'stock', branchId] as const,
};
