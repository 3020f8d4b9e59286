import { json } from '@/lib/http/handler';
import { databaseUp } from '@/lib/services/health';

export const dynamic = 'force-dynamic';

export async function GET() {
  const up = await databaseUp();
  return json({ ok: up, db: up ? 'up' : 'down' }, up ? 200 : 503);
}
