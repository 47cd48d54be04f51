/**
 * Roles and what each may do, shared by the server (which enforces it on every route) and the client
 * (which only hides what a role cannot do). A role belongs to a membership: the same person can be the
 * owner of their own farm and an advisor to another.
 */
export const ROLES = ['owner', 'nutritionist', 'mill_operator', 'advisor', 'farm_member'] as const;
export type Role = (typeof ROLES)[number];

/** Words a person reads for each role. */
export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  nutritionist: 'Nutritionist',
  mill_operator: 'Mill operator',
  advisor: 'Advisor',
  farm_member: 'Farm member',
};

export const ROLE_DESCRIPTIONS: Record<Role, string> = {
  owner: 'Manages members and settings; can do everything in the organization.',
  nutritionist: 'Edits the library and requirements, solves and approves formulas.',
  mill_operator: 'Sees approved formulas and batch sheets, records batches made.',
  advisor: 'Works with the farms that invited them: imports lab analyses, solves and shares results.',
  farm_member: 'Sees what was shared with the farm and checks a ration on a phone.',
};

export const PERMISSIONS = [
  'members:read',
  'members:manage',
  'settings:manage',
  'library:read',
  'library:write',
  'lab:import',
  'requirements:read',
  'requirements:write',
  'formulas:read',
  'formulas:read-approved',
  'formulas:solve',
  'formulas:approve',
  'batches:record',
  'results:share',
  'results:read-shared',
  'ration:check',
  'supply:read',
  'supply:write',
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const EVERYONE: readonly Role[] = ROLES;

/** Which roles hold each permission. The owner holds all of them. */
export const PERMISSION_ROLES: Record<Permission, readonly Role[]> = {
  'members:read': EVERYONE,
  'members:manage': ['owner'],
  'settings:manage': ['owner'],
  'library:read': EVERYONE,
  'library:write': ['owner', 'nutritionist'],
  'lab:import': ['owner', 'nutritionist', 'advisor'],
  'requirements:read': EVERYONE,
  'requirements:write': ['owner', 'nutritionist'],
  'formulas:read': ['owner', 'nutritionist', 'advisor'],
  'formulas:read-approved': ['owner', 'nutritionist', 'advisor', 'mill_operator'],
  'formulas:solve': ['owner', 'nutritionist', 'advisor'],
  'formulas:approve': ['owner', 'nutritionist'],
  'batches:record': ['owner', 'mill_operator'],
  'results:share': ['owner', 'nutritionist', 'advisor'],
  'results:read-shared': EVERYONE,
  'ration:check': ['owner', 'nutritionist', 'advisor', 'farm_member'],
  'supply:read': ['owner', 'nutritionist', 'advisor', 'farm_member'],
  'supply:write': ['owner', 'nutritionist'],
};

/** True when `role` holds `permission`. */
export function can(role: Role | null | undefined, permission: Permission): boolean {
  return !!role && PERMISSION_ROLES[permission].includes(role);
}
