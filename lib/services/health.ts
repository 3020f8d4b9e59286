import { sql } from 'drizzle-orm';
import { db } from '@/db/client';

/** True when the database answers a trivial query within its connect timeout. */
export async function databaseUp(): Promise<boolean> {
  try {
    await db.execute(sql`SELECT 1`);
    return true;
  } catch {
    return false;
  }
}
