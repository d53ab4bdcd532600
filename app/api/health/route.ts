// GET /api/health – whether the app and its database answer.
import { NextResponse } from 'next/server';
import { pingDatabase } from '@/db/health';

export const dynamic = 'force-dynamic';

export async function GET() {
  const up = await pingDatabase();
  return NextResponse.json({ ok: up, db: up ? 'up' : 'down' }, { status: up ? 200 : 503 });
}
