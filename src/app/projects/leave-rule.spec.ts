import { describe, expect, it } from 'vitest';
import { leaveBlockedReason } from './leave-rule';

describe('who may leave a project', () => {
  it('when the caller is the only owner, then leaving is blocked with what to do instead', () => {
    const members = [{ userId: 1, role: 'owner' as const }, { userId: 2, role: 'editor' as const }, { userId: 3, role: 'viewer' as const }];
    expect(leaveBlockedReason(members, 1)).toBe('You are the only owner. Make another member an owner first, or delete the project.');
  });
  it('when another owner remains, then the caller may leave', () => {
    expect(leaveBlockedReason([{ userId: 1, role: 'owner' }, { userId: 2, role: 'owner' }], 1)).toBeNull();
  });
  it('when the caller is not an owner, or not in the list, then nothing blocks leaving', () => {
    const members = [{ userId: 1, role: 'owner' as const }, { userId: 2, role: 'editor' as const }];
    expect(leaveBlockedReason(members, 2)).toBeNull();
    expect(leaveBlockedReason(members, 9)).toBeNull();
    expect(leaveBlockedReason(members, undefined)).toBeNull();
  });
});
