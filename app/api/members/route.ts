import { NextResponse } from 'next/server';
import { listWorkspaceMembers } from '@/db/queries/memberships';
import { errorResponse } from '@/features/auth/errors';
import { requirePermission } from '@/features/auth/guard';
import { canManageMembers } from '@/lib/auth/permissions';

export const dynamic = 'force-dynamic';

/** The workspace's members with their roles (admins only). */
export async function GET() {
  try {
    const admin = await requirePermission(canManageMembers);
    const members = await listWorkspaceMembers({ workspaceId: admin.workspaceId });
    return NextResponse.json({
      members: members.map((member) => ({ ...member, joinedAt: member.joinedAt.toISOString() })),
    });
  } catch (error) {
    return errorResponse(error);
  }
}
