/**
 * The one place that decides who may do what. Pages, server actions and route handlers ask
 * `can(role, action)` through lib/auth/guard.ts; nothing else compares role names.
 */
export const ROLES = ['admin', 'analyst', 'reviewer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

export const ACTIONS = {
  /** See the organization's shell, dashboard and approved results. */
  'organization:read': ['admin', 'analyst', 'reviewer', 'viewer'],
  /** Read every result, approved or not. */
  'results:read-all': ['admin', 'analyst', 'reviewer'],
  /** Create samples, batches and sessions; upload and analyse drop photos. */
  'records:write': ['admin', 'analyst'],
  /** Export tables and comparisons as CSV. */
  'results:export': ['admin', 'analyst', 'reviewer'],
  /** Approve or reject results; sign reports. */
  'review:decide': ['admin', 'reviewer'],
  /** Coatings, specs and the probe-liquid library. */
  'catalog:manage': ['admin'],
  /** Members, invitations, roles and the organization's name. */
  'team:manage': ['admin'],
  /** Browse the audit log. */
  'audit:read': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Action = keyof typeof ACTIONS;

export function can(role: Role | null | undefined, action: Action): boolean {
  if (!role) return false;
  return (ACTIONS[action] as readonly Role[]).includes(role);
}

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}

export const ROLE_LABELS: Record<Role, { name: string; summary: string }> = {
  admin: { name: 'Admin', summary: 'Lab manager: everything, plus team, specs and audit log' },
  analyst: { name: 'Analyst', summary: 'Technician or engineer: measures, analyses, compares' },
  reviewer: { name: 'Reviewer', summary: 'QA or senior engineer: approves, rejects, signs' },
  viewer: { name: 'Viewer', summary: 'Customer or manager: reads approved results' },
};
