import { spawn } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { BASE_URL } from '../helpers/client';

describe('GET /api/health', () => {
  it('answers ok with the database up', async () => {
    const res = await fetch(`${BASE_URL}/api/health`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true, db: 'up' });
  });

  it('answers 503 with the database stopped', async () => {
    // A second server of the same build whose database is down (nothing listens on its port).
    const port = 3199 - Number(process.env.LANEWISE_TEST_SLOT ?? 0);
    const child = spawn(
      path.resolve('node_modules/.bin/next'),
      ['start', '-H', '127.0.0.1', '-p', String(port)],
      {
        env: { ...process.env, DATABASE_URL: 'mysql://lanewise:x@127.0.0.1:1/none' },
        stdio: 'ignore',
        detached: true,
      },
    );
    try {
      let res: Response | null = null;
      for (let i = 0; i < 100 && !res; i++) {
        res = await fetch(`http://127.0.0.1:${port}/api/health`).catch(() => null);
        if (!res) await new Promise((r) => setTimeout(r, 200));
      }
      expect(res?.status).toBe(503);
      expect(await res?.json()).toEqual({ ok: false, db: 'down' });
    } finally {
      process.kill(-child.pid!, 'SIGTERM');
    }
  });
});
