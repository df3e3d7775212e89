/**
 * Roles inside an organisation and what each may do. Used by the server's
 * authorisation layer and by the client to hide what a role cannot do, so the
 * two can never disagree.
 */
export const roles = ['owner', 'designer', 'viewer'] as const;
export type Role = (typeof roles)[number];

/** Every action the authorisation layer knows, with the roles allowed to do it. */
export const permissions = {
  /** Read anything in the organisation: projects, climate, equipment, members. */
  'org:read': ['owner', 'designer', 'viewer'],
  /** Create and change projects, climate sites, equipment lists, scenarios; send reports. */
  'project:write': ['owner', 'designer'],
  /** Invite, change roles, remove members. */
  'member:manage': ['owner'],
  /** Plan and billing. */
  'billing:manage': ['owner'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof permissions;

export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return (permissions[action] as readonly Role[]).includes(role);
}

export const roleLabels: Record<Role, string> = {
  owner: 'Owner',
  designer: 'Designer',
  viewer: 'Viewer',
};
