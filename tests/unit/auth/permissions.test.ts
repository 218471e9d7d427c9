import { describe, expect, it } from 'vitest';
import { ACTIONS, can, isRole, ROLES } from '@/lib/auth/permissions';

// The role table of the product brief (shared/BRIEF.md, "Who uses it").
describe('permissions', () => {
  it('admin may do everything', () => {
    for (const action of Object.keys(ACTIONS) as (keyof typeof ACTIONS)[]) {
      expect(can('admin', action)).toBe(true);
    }
  });

  it('analyst writes records and exports, but neither reviews nor manages the team', () => {
    expect(can('analyst', 'records:write')).toBe(true);
    expect(can('analyst', 'results:export')).toBe(true);
    expect(can('analyst', 'review:decide')).toBe(false);
    expect(can('analyst', 'team:manage')).toBe(false);
  });

  it('reviewer reads everything an analyst reads and decides reviews, but writes no records', () => {
    expect(can('reviewer', 'results:read-all')).toBe(true);
    expect(can('reviewer', 'review:decide')).toBe(true);
    expect(can('reviewer', 'records:write')).toBe(false);
  });

  it('viewer only reads the organization and its approved results', () => {
    const allowed = (Object.keys(ACTIONS) as (keyof typeof ACTIONS)[]).filter((a) => can('viewer', a));
    expect(allowed).toEqual(['organization:read']);
  });

  it('nobody without a role may do anything', () => {
    expect(can(null, 'organization:read')).toBe(false);
    expect(can(undefined, 'organization:read')).toBe(false);
  });

  it('recognises exactly the four roles', () => {
    expect(ROLES).toEqual(['admin', 'analyst', 'reviewer', 'viewer']);
    expect(isRole('viewer')).toBe(true);
    expect(isRole('owner')).toBe(false);
  });
});
