import type { Member } from '../../../shared/projects';

/**
 * Why the signed-in member cannot leave the project, or null when they can.
 * A project always keeps an owner (the server refuses the last owner's leaving
 * with 409), so the only owner is told what to do instead of being refused.
 */
export function leaveBlockedReason(members: readonly Pick<Member, 'userId' | 'role'>[], userId: number | undefined): string | null {
  const me = members.find((m) => m.userId === userId);
  if (!me || me.role !== 'owner') return null;
  if (members.some((m) => m.role === 'owner' && m.userId !== userId)) return null;
  return 'You are the only owner. Make another member an owner first, or delete the project.';
}
