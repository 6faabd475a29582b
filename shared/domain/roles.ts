/** Organisation kinds and the roles their members hold. */
export const ORGANISATION_KINDS = ['contractor', 'merchant'] as const;
export type OrganisationKind = (typeof ORGANISATION_KINDS)[number];

export const ROLES = ['contractor_owner', 'contractor_estimator', 'merchant_owner', 'merchant_sales', 'merchant_dispatcher', 'driver'] as const;
export type Role = (typeof ROLES)[number];

/** Which roles a member of each kind of organisation may hold. Drivers work for merchants. */
export const ROLES_BY_KIND: Record<OrganisationKind, readonly Role[]> = {
  contractor: ['contractor_owner', 'contractor_estimator'],
  merchant: ['merchant_owner', 'merchant_sales', 'merchant_dispatcher', 'driver'],
};

export const OWNER_ROLE: Record<OrganisationKind, Role> = {
  contractor: 'contractor_owner',
  merchant: 'merchant_owner',
};

/** Words shown to people for each role. */
export const ROLE_LABELS: Record<Role, string> = {
  contractor_owner: 'Contractor owner',
  contractor_estimator: 'Estimator',
  merchant_owner: 'Merchant owner',
  merchant_sales: 'Order desk',
  merchant_dispatcher: 'Yard and transport',
  driver: 'Driver',
};

export function kindOfRole(role: Role): OrganisationKind {
  return ROLES_BY_KIND.contractor.includes(role) ? 'contractor' : 'merchant';
}
