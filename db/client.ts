import { drizzle } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import { env } from '@/lib/env';
import * as schema from './schema';

/**
 * One connection pool per process. Kept on globalThis so Next.js dev reloads do not open a new
 * pool on every change.
 */
const globalForDb = globalThis as unknown as { lanewisePool?: mysql.Pool };

export function pool(): mysql.Pool {
  if (!globalForDb.lanewisePool) {
    globalForDb.lanewisePool = mysql.createPool({
      uri: env().DATABASE_URL,
      connectionLimit: 10,
      timezone: 'Z',
      dateStrings: false,
      supportBigNumbers: true,
      // Fail fast when the server is down so /api/health can answer 503.
      connectTimeout: 3000,
    });
  }
  return globalForDb.lanewisePool;
}

export const db = drizzle({ client: pool(), schema, mode: 'default' });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

export async function closeDb(): Promise<void> {
  await globalForDb.lanewisePool?.end();
  globalForDb.lanewisePool = undefined;
}
