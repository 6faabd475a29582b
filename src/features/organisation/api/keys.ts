/**
 * Query keys of the organisation feature. A person sees only their own organisation, so its
 * detail key is "current"; the list level is there for counterparties later.
 */
export const organisationKeys = {
  all: ['organisation'] as const,
  lists: () => [...organisationKeys.all, 'list'] as const,
  details: () => [...organisationKeys.all, 'detail'] as const,
  detail: (id: number | 'current') => [...organisationKeys.details(), id] as const,
};
