/**
 * What each role may do (PRODUCT.md): access-control statements for better-auth's organization plugin, used by
 * the server wrapper for every route and by the UI to hide what a member cannot do.
 */
import { createAccessControl } from 'better-auth/plugins/access';
import { defaultStatements, ownerAc } from 'better-auth/plugins/organization/access';

export const statements = {
  ...defaultStatements,
  job: ['create', 'read', 'update', 'delete', 'status'],
  vehicle: ['create', 'read', 'update', 'delete'],
  capture: ['upload', 'read', 'delete'],
  analysis: ['save', 'read'],
  report: ['edit', 'sign', 'send', 'share', 'read'],
  profile: ['create', 'read', 'delete'],
  shop: ['read', 'manage', 'retention'],
} as const;

export const ac = createAccessControl(statements);

export const owner = ac.newRole({
  ...ownerAc.statements,
  job: ['create', 'read', 'update', 'delete', 'status'],
  vehicle: ['create', 'read', 'update', 'delete'],
  capture: ['upload', 'read', 'delete'],
  analysis: ['save', 'read'],
  report: ['edit', 'sign', 'send', 'share', 'read'],
  profile: ['create', 'read', 'delete'],
  shop: ['read', 'manage', 'retention'],
});

export const technician = ac.newRole({
  job: ['create', 'read', 'update', 'status'],
  vehicle: ['create', 'read', 'update'],
  capture: ['upload', 'read'],
  analysis: ['save', 'read'],
  report: ['edit', 'sign', 'send', 'share', 'read'],
  profile: ['read'],
  shop: ['read'],
});

export const advisor = ac.newRole({
  // An advisor moves a job (done, reopened) but does not edit it.
  job: ['read', 'status'],
  vehicle: ['read'],
  capture: ['read'],
  analysis: ['read'],
  report: ['send', 'share', 'read'],
  profile: ['read'],
  shop: ['read'],
});

export const roles = { owner, technician, advisor };
export type RoleName = keyof typeof roles;
/** The roles, most powerful first. */
export const ROLE_NAMES = ['owner', 'technician', 'advisor'] as const satisfies readonly RoleName[];

type Statements = typeof statements;
export type Permission = { [K in keyof Statements]?: Statements[K][number][] };

/** Whether a role holds every action in `permission`. */
export function can(role: string, permission: Permission): boolean {
  const r = roles[role as RoleName];
  if (!r) return false;
  return r.authorize(permission as never).success;
}
