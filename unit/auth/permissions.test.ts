import { describe, expect, it } from 'vitest';
import * as permissions from '@/lib/auth/permissions';
import { roles, type Role } from '@/lib/auth/roles';

// Written out by hand from the product's roles table (admin = engineer + members, and may sign a review;
// reviewer reads, comments and decides; engineers answer comments; regulator reads released work, review record and audit trail, exports).
const table: Record<string, Role[]> = {
  canManageMembers: ['admin'],
  canEditPlans: ['admin', 'engineer'],
  canEditParts: ['admin', 'engineer'],
  canUploadBenchRecords: ['admin', 'engineer'],
  canRequestReview: ['admin', 'engineer'],
  canCommentOnReview: ['admin', 'engineer', 'reviewer'],
  canDecideReview: ['reviewer', 'admin'],
  canReadWorkInProgress: ['admin', 'engineer', 'reviewer'],
  canReadReleased: ['admin', 'engineer', 'reviewer', 'regulator'],
  canReadAuditTrail: ['admin', 'engineer', 'reviewer', 'regulator'],
  canExport: ['admin', 'engineer', 'reviewer', 'regulator'],
  canWriteAnything: ['admin', 'engineer', 'reviewer'],
};

describe('permissions follow the roles table', () => {
  it('covers every exported permission function', () => {
    expect(Object.keys(permissions).sort()).toEqual(Object.keys(table).sort());
  });

  for (const [name, allowed] of Object.entries(table)) {
    it.each(roles)(`${name} for %s`, (role) => {
      const fn = permissions[name as keyof typeof permissions] as (actor: { role: Role }) => boolean;
      expect(fn({ role })).toBe(allowed.includes(role));
    });
  }

  it('never lets the regulator write', () => {
    const writes = ['canManageMembers', 'canEditPlans', 'canEditParts', 'canUploadBenchRecords', 'canRequestReview', 'canCommentOnReview', 'canDecideReview', 'canWriteAnything'] as const;
    for (const name of writes) expect(permissions[name]({ role: 'regulator' }), name).toBe(false);
  });
});
