import { expect } from 'vitest';
import type { Client } from './client';

export type CatalogJson = {
  id: string;
  status: 'queued' | 'ingesting' | 'ready' | 'failed';
  rowCount: number;
  rejectedCount: number;
  error: string | null;
  rejected?: { line: number; reason: string }[];
};

/** Uploads a file through the API as the browser form does. */
export async function upload(
  client: Client,
  projectId: string,
  opts: {
    content: string | Buffer;
    fileName?: string;
    name?: string;
    kind?: string;
    mapping?: unknown;
    policy?: string;
  },
) {
  const form = new FormData();
  const bytes = typeof opts.content === 'string' ? opts.content : new Uint8Array(opts.content);
  form.set('file', new Blob([bytes]), opts.fileName ?? 'catalog.csv');
  form.set('name', opts.name ?? 'Test catalog');
  form.set('kind', opts.kind ?? 'co');
  if (opts.mapping) form.set('mapping', JSON.stringify(opts.mapping));
  if (opts.policy) form.set('policy', opts.policy);
  const res = await client.request('POST', `/api/projects/${projectId}/catalogs`, form);
  const body = await res.json();
  return { status: res.status, body };
}

/** Polls a catalog until it is ready or failed. */
export async function waitForCatalog(
  client: Client,
  id: string,
  timeoutMs = 60_000,
): Promise<CatalogJson> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const r = await client.json<{ catalog: CatalogJson }>('GET', `/api/catalogs/${id}`);
    expect(r.status).toBe(200);
    if (r.body.catalog.status === 'ready' || r.body.catalog.status === 'failed')
      return r.body.catalog;
    if (Date.now() > deadline) throw new Error(`catalog ${id} still ${r.body.catalog.status}`);
    await new Promise((res) => setTimeout(res, 200));
  }
}

/** A CSV of n sources along the plane, with a comment line first: `# …` then `GLON,GLAT,VLSR,NAME`. */
export function planeCsv(n: number, extraLines: string[] = []) {
  const lines = ['# invented test sources', 'GLON,GLAT,VLSR,NAME'];
  for (let i = 0; i < n; i++) {
    const l = (i * 137.508) % 360;
    const b = ((i * 7) % 11) / 2 - 2.5;
    const v = ((i * 53) % 200) - 60;
    lines.push(`${l.toFixed(4)},${b.toFixed(3)},${v.toFixed(2)},SRC-${String(i).padStart(4, '0')}`);
  }
  return [...lines, ...extraLines].join('\n') + '\n';
}
