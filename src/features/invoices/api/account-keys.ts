/** Query keys of the desk's contractor accounts (payment terms). Invalidate by prefix. */
export const accountKeys = {
  all: ['accounts'] as const,
  lists: () => [...accountKeys.all, 'list'] as const,
  list: () => [...accountKeys.lists(), {}] as const,
};
