import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import { queryTimedOut } from '@/lib/http/errors';
import { pool } from './client';
import * as schema from './schema';

/** MariaDB's ER_STATEMENT_TIMEOUT: a statement ran past `max_statement_time`. */
export const STATEMENT_TIMEOUT_ERRNO = 1969;

const DEFAULT_SECONDS = 20;

/**
 * How long one statement of a request may run, from LANEWISE_QUERY_SECONDS (default 20 s).
 * Read on every call, so a test or an operator can change it without a new pool.
 */
export function querySeconds(): number {
  const raw = process.env.LANEWISE_QUERY_SECONDS;
  if (raw === undefined || raw === '') return DEFAULT_SECONDS;
  const seconds = Number(raw);
  if (!Number.isFinite(seconds) || seconds <= 0)
    throw new RangeError(
      `LANEWISE_QUERY_SECONDS must be a positive number of seconds, got "${raw}"`,
    );
  return seconds;
}

/** The query builder on one connection (the pool's `db` without its pool). */
export type LimitedDb = MySql2Database<typeof schema>;

/** True when `e`, or an error it wraps (drizzle wraps the driver's), is ER_STATEMENT_TIMEOUT. */
export function isStatementTimeout(e: unknown): boolean {
  for (let x = e; x && typeof x === 'object'; x = (x as { cause?: unknown }).cause) {
    if ((x as { errno?: unknown }).errno === STATEMENT_TIMEOUT_ERRNO) return true;
  }
  return false;
}

/**
 * Runs `fn` on one pooled connection whose every statement MariaDB stops after
 * `querySeconds()` (session `max_statement_time`), so a request whose query grows with the data
 * cannot hold the server. A stopped statement becomes a 503 naming `what` ("comparison",
 * "page of rows") and the limit. The session limit is set back to the server's default before
 * the connection returns to the pool.
 */
export async function withStatementTimeout<T>(
  what: string,
  fn: (q: LimitedDb) => Promise<T>,
): Promise<T> {
  const seconds = querySeconds();
  const conn = await pool().getConnection();
  try {
    await conn.query('SET SESSION max_statement_time = ?', [seconds]);
    return await fn(drizzle({ client: conn, schema, mode: 'default' }));
  } catch (e) {
    if (isStatementTimeout(e)) throw queryTimedOut(what, seconds);
    throw e;
  } finally {
    await conn
      .query('SET SESSION max_statement_time = DEFAULT')
      .then(() => conn.release())
      .catch(() => conn.destroy());
  }
}
