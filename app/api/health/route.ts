import { NextResponse } from 'next/server';
import { pingDatabase } from '@/db/queries/health';

export const dynamic = 'force-dynamic';

/** Readiness: 200 `{ ok: true, db: true }` when the database answers, else 503. */
export async function GET() {
  const db = await pingDatabase();
  return NextResponse.json({ ok: db, db }, { status: db ? 200 : 503, headers: { 'Cache-Control': 'no-store' } });
}
