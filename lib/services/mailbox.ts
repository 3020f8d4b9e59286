import fs from 'node:fs/promises';
import path from 'node:path';
import { env } from '@/lib/env';

export type CaughtMail = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
};

/** Messages kept by the local mail catcher, newest first (local mode only). */
export async function listCaughtMail(limit = 200): Promise<CaughtMail[]> {
  const dir = env().MAIL_CATCHER_DIR;
  let names: string[];
  try {
    names = (await fs.readdir(dir)).filter((n) => n.endsWith('.json'));
  } catch {
    return [];
  }
  names.sort().reverse();
  const out: CaughtMail[] = [];
  for (const n of names.slice(0, limit)) {
    out.push(JSON.parse(await fs.readFile(path.join(dir, n), 'utf8')) as CaughtMail);
  }
  return out;
}
