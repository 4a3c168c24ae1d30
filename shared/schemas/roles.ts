/**
 * The roles a membership carries and the one permission table both the server (server/auth/require-role.ts,
 * the guard) and the client (to hide what a role cannot do) read. A role is per team: one person can be
 * `animator` in "UI Motion" and `viewer` in "Gameplay Feel".
 *
 * To add an ability: add a key to PERMISSIONS with the roles that have it, then guard its routes with
 * `requireTeam('<permission>')` and extend tests/api/authorization-matrix.test.ts.
 */
export const ROLES = ['admin', 'lead', 'animator', 'engineer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABEL: Record<Role, string> = {
  admin: 'Admin',
  lead: 'Lead',
  animator: 'Animator',
  engineer: 'Engineer',
  viewer: 'Viewer',
};

export const ROLE_SUMMARY: Record<Role, string> = {
  admin: 'members, roles, invitations, service tokens, webhooks',
  lead: 'reviews, approves and releases channels',
  animator: 'edits curves and proposes pack versions',
  engineer: 'target profiles and downloads',
  viewer: 'reads the library',
};

/** Ability → roles that have it. `team.read` is the only one a service token can hold. */
export const PERMISSIONS = {
  'team.read': ['admin', 'lead', 'animator', 'engineer', 'viewer'],
  'members.read': ['admin', 'lead', 'animator', 'engineer', 'viewer'],
  'members.manage': ['admin'],
  'invitations.manage': ['admin'],
  'tokens.manage': ['admin'],
  'webhooks.manage': ['admin'],
  'outbox.read': ['admin'],
  'curves.edit': ['admin', 'lead', 'animator'],
  'versions.propose': ['admin', 'lead', 'animator'],
  'versions.review': ['admin', 'lead'],
  'channels.release': ['admin', 'lead'],
  'profiles.edit': ['admin', 'engineer'],
  'artifacts.download': ['admin', 'lead', 'animator', 'engineer', 'viewer'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

/** Abilities a read-only service token has (build servers pull; they never write). */
export const TOKEN_PERMISSIONS: readonly Permission[] = ['team.read', 'artifacts.download'];

export function roleCan(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
