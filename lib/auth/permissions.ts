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

/**
 * API tokens (/api/v1 only) carry a scope instead of a role: reading records and every result,
 * measuring (creating samples and sessions, posting photos), or both — never review or admin.
 */
export const API_TOKEN_SCOPES = ['read', 'measure', 'read-measure'] as const;
export type ApiTokenScope = (typeof API_TOKEN_SCOPES)[number];

export const API_TOKEN_SCOPE_ACTIONS = {
  read: ['organization:read', 'results:read-all'],
  measure: ['records:write'],
  'read-measure': ['organization:read', 'results:read-all', 'records:write'],
} as const satisfies Record<ApiTokenScope, readonly Action[]>;

export function tokenCan(scope: ApiTokenScope, action: Action): boolean {
  return (API_TOKEN_SCOPE_ACTIONS[scope] as readonly Action[]).includes(action);
}

export const API_TOKEN_SCOPE_LABELS: Record<ApiTokenScope, string> = {
  read: 'Read records and results',
  measure: 'Measure: create samples and sessions, post photos',
  'read-measure': 'Read and measure',
};
