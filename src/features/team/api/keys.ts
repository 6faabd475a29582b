/** No filters yet; the slot keeps the key shape stable for when lists gain them. */
export type MemberFilters = Record<string, never>;

/** Query keys of the team feature: members and pending invitations. Invalidate by prefix. */
export const memberKeys = {
  all: ['members'] as const,
  lists: () => [...memberKeys.all, 'list'] as const,
  list: (filters: MemberFilters = {}) => [...memberKeys.lists(), filters] as const,
  details: () => [...memberKeys.all, 'detail'] as const,
  detail: (id: number) => [...memberKeys.details(), id] as const,
};

export const invitationKeys = {
  all: ['invitations'] as const,
  lists: () => [...invitationKeys.all, 'list'] as const,
  list: (filters: MemberFilters = {}) => [...invitationKeys.lists(), filters] as const,
  details: () => [...invitationKeys.all, 'detail'] as const,
  detail: (id: number) => [...invitationKeys.details(), id] as const,
};
