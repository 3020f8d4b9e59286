import { beforeAll, describe, expect, it } from 'vitest';
import mysql from 'mysql2/promise';
import { newUser, type Client } from '../helpers/client';
import { planeCsv, upload, waitForCatalog } from '../helpers/catalogs';
import { makeTeam, type Team } from '../helpers/team';

describe('catalog upload and ingest', () => {
  let owner: Client;
  let projectId: string;
  beforeAll(async () => {
    const u = await newUser('cat');
    owner = u.client;
    const p = await owner.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Catalogs',
    });
    projectId = p.body.project.id;
  });

  it('ingests a CSV, reports bad rows by file line, and serves paged, sorted rows', async () => {
    // Lines 1–2 are the comment and the header, so data row k sits on line k + 2.
    const csv = planeCsv(200, [
      '12.5,95.2,10,BAD-LAT',
      '13.0,abc,10,BAD-NUM',
      '14.0,0.5,10,TOO,MANY',
    ]);
    const up = await upload(owner, projectId, { content: csv, name: 'Plane CO' });
    expect(up.status).toBe(202);
    expect(up.body.catalog.status).toBe('queued');
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('ready');
    expect(c.rowCount).toBe(200);
    expect(c.rejectedCount).toBe(3);
    expect(c.rejected!.map((r) => r.line)).toEqual([203, 204, 205]);
    expect(c.rejected![0].reason).toMatch(/95\.2/);
    expect(c.rejected![1].reason).toMatch(/abc/);

    const page = await owner.json<{
      rows: { row: number; l: number; name: string }[];
      total: number;
    }>('GET', `/api/catalogs/${c.id}/rows?page=2&pageSize=25&sort=l&dir=desc`);
    expect(page.status).toBe(200);
    expect(page.body.total).toBe(200);
    expect(page.body.rows).toHaveLength(25);
    const ls = page.body.rows.map((r) => r.l);
    expect([...ls].sort((a, b) => b - a)).toEqual(ls);
    const all = await owner.json<{ rows: { l: number }[] }>(
      'GET',
      `/api/catalogs/${c.id}/rows?pageSize=500&sort=l&dir=desc`,
    );
    expect(all.body.rows[25].l).toBe(page.body.rows[0].l);

    const filtered = await owner.json<{ rows: { l: number; b: number }[]; total: number }>(
      'GET',
      `/api/catalogs/${c.id}/rows?lMin=100&lMax=200&pageSize=500`,
    );
    expect(filtered.body.rows.every((r) => r.l >= 100 && r.l <= 200)).toBe(true);
    expect(filtered.body.total).toBe(filtered.body.rows.length);

    // A longitude range whose start is above its end runs through l = 0°.
    const wrapped = await owner.json<{ rows: { l: number }[]; total: number }>(
      'GET',
      `/api/catalogs/${c.id}/rows?lMin=340&lMax=20&pageSize=500`,
    );
    expect(wrapped.body.total).toBe(all.body.rows.filter((r) => r.l >= 340 || r.l <= 20).length);
    expect(wrapped.body.total).toBeGreaterThan(10);
    expect(wrapped.body.rows.every((r) => r.l >= 340 || r.l <= 20)).toBe(true);

    const named = await owner.json<{ rows: { name: string }[]; total: number }>(
      'GET',
      `/api/catalogs/${c.id}/rows?q=SRC-0042`,
    );
    expect(named.body.total).toBe(1);
    expect(named.body.rows[0].name).toBe('SRC-0042');

    const points = await owner.get(`/api/catalogs/${c.id}/points`);
    expect(points.headers.get('x-point-count')).toBe('200');
    expect((await points.arrayBuffer()).byteLength).toBe(200 * 12);

    const csvOut = await (await owner.get(`/api/catalogs/${c.id}/export.csv`)).text();
    const lines = csvOut.trim().split(/\r?\n/);
    expect(lines).toHaveLength(201);
    expect(lines[0]).toMatch(/^row,line,name,l_deg,b_deg,v_lsr_kms/);
    expect(lines[0]).toContain('orig_GLON');
  });

  it('sorts on size, line width and distance like a plain sort of all rows, with and without a filter', async () => {
    const lines = ['GLON,GLAT,VLSR,SIZE_ARCSEC,FWHM_KMS,DIST_KPC,NAME'];
    for (let i = 0; i < 120; i++) {
      const size = i % 9 === 0 ? '' : String(((i * 29) % 97) + 0.5);
      const dist = i % 7 === 0 ? '' : String(((i * 13) % 17) / 2 + 0.5);
      lines.push(
        `${((i * 37.1) % 360).toFixed(2)},${((i * 7) % 11) / 2 - 2.5},${((i * 53) % 200) - 60},${size},${((i * 31) % 41) / 4 + 0.5},${dist},S${i}`,
      );
    }
    const mapping = {
      position: {
        system: 'galactic',
        lon: { column: 'GLON', unit: 'deg' },
        lat: { column: 'GLAT', unit: 'deg' },
      },
      velocity: { column: 'VLSR', unit: 'km/s', frame: 'lsr', convention: 'radio' },
      size: { column: 'SIZE_ARCSEC', unit: 'arcsec', kind: 'radius' },
      lineWidth: { column: 'FWHM_KMS', unit: 'km/s', kind: 'fwhm' },
      distance: { column: 'DIST_KPC', unit: 'kpc' },
      name: { column: 'NAME' },
    };
    const up = await upload(owner, projectId, {
      content: lines.join('\n') + '\n',
      name: 'Sized',
      mapping,
    });
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('ready');
    type Row = { row: number; l: number } & Record<string, number | null>;
    const get = async (query: string) =>
      (
        await owner.json<{ rows: Row[]; total: number }>(
          'GET',
          `/api/catalogs/${c.id}/rows?pageSize=500&${query}`,
        )
      ).body;
    const everything = (await get('sort=row')).rows;
    // The oracle: MariaDB's order, written out: NULL first ascending, last descending; ties by row.
    const sorted = (rows: Row[], key: string, desc: boolean) =>
      [...rows]
        .sort((x, y) => {
          const a = x[key] ?? -Infinity;
          const b = y[key] ?? -Infinity;
          const d = a === b ? x.row - y.row : a < b ? -1 : 1;
          return desc ? -d : d;
        })
        .map((r) => r.row);
    expect(everything.filter((r) => r.radiusArcsec === null).length).toBeGreaterThan(5);
    for (const key of ['radiusArcsec', 'lineWidthKms', 'distKpc']) {
      for (const dir of ['asc', 'desc']) {
        const got = (await get(`sort=${key}&dir=${dir}`)).rows.map((r) => r.row);
        expect([key, dir, got]).toEqual([key, dir, sorted(everything, key, dir === 'desc')]);
        const inRange = everything.filter((r) => r.l >= 100 && r.l <= 250);
        const filtered = await get(`sort=${key}&dir=${dir}&lMin=100&lMax=250`);
        expect(filtered.total).toBe(inRange.length);
        expect(filtered.rows.map((r) => r.row)).toEqual(sorted(inRange, key, dir === 'desc'));
      }
    }
  });

  it('converts equatorial sexagesimal positions and heliocentric velocities', async () => {
    // The Galactic centre (Hipparcos Vol. 1 §1.5.3): α = 266.40499°, δ = −28.93617° → l = 0, b = 0.
    const csv = 'NAME,RA,DEC,VHEL\nGC,17:45:37.1976,-28:56:10.212,0\n';
    const up = await upload(owner, projectId, {
      content: csv,
      mapping: {
        position: {
          system: 'equatorial',
          lon: { column: 'RA', unit: 'sexagesimal' },
          lat: { column: 'DEC', unit: 'sexagesimal' },
        },
        velocity: { column: 'VHEL', unit: 'km/s', frame: 'heliocentric', convention: 'radio' },
        name: { column: 'NAME' },
      },
    });
    expect(up.status).toBe(202);
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('ready');
    const { body } = await owner.json<{ rows: { l: number; b: number; v: number }[] }>(
      'GET',
      `/api/catalogs/${c.id}/rows`,
    );
    const l = body.rows[0].l > 180 ? body.rows[0].l - 360 : body.rows[0].l;
    expect(Math.abs(l) * 3600).toBeLessThan(0.1);
    expect(Math.abs(body.rows[0].b) * 3600).toBeLessThan(0.1);
    // v_LSR = v_hel + U cos l cos b + V sin l cos b + W sin b = 10.27 at l = b = 0 (kinematic LSR, common practice).
    expect(body.rows[0].v).toBeCloseTo(10.27, 2);
  });

  it('with the reject-file policy, one bad row fails the file and stores no rows', async () => {
    const up = await upload(owner, projectId, {
      content: planeCsv(50, ['1,2,x,BAD']),
      policy: 'reject-file',
    });
    expect(up.status).toBe(202);
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('failed');
    expect(c.error).toMatch(/line 53/);
    expect(c.rowCount).toBe(0);
    expect((await owner.get(`/api/catalogs/${c.id}/rows`)).status).toBe(409);
  });

  // 500 rows: the cut lies past what the upload checks, so it is found by the ingest job.
  it('fails a truncated VOTable clearly, leaving no rows', async () => {
    const rows = Array.from(
      { length: 500 },
      (_, i) => `<TR><TD>${i}.5</TD><TD>0.1</TD><TD>12</TD></TR>`,
    ).join('\n');
    const vot = `<?xml version="1.0"?>\n<VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3">\n<RESOURCE><TABLE>\n<FIELD name="glon" datatype="double" unit="deg" ucd="pos.galactic.lon"/>\n<FIELD name="glat" datatype="double" unit="deg" ucd="pos.galactic.lat"/>\n<FIELD name="vlsr" datatype="double" unit="km/s" ucd="spect.dopplerVeloc"/>\n<DATA><TABLEDATA>\n${rows}\n<TR><TD>1`;
    const up = await upload(owner, projectId, { content: vot, fileName: 'cut.vot' });
    expect(up.status).toBe(202);
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('failed');
    expect(c.error).toMatch(/line \d+/i);
    expect(c.rowCount).toBe(0);
  });

  const badFiles: {
    name: string;
    content: string | Buffer;
    mapping?: unknown;
    status: number;
    code?: string;
    message: RegExp;
  }[] = [
    { name: 'an empty file', content: '', status: 400, code: 'empty-file', message: /empty/i },
    {
      name: 'a header only',
      content: 'GLON,GLAT,VLSR\n',
      status: 400,
      code: 'no-data-rows',
      message: /row/i,
    },
    {
      name: 'binary garbage',
      content: Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0, 0, 0x0d, 0xff, 0xfe, 0, 1, 2, 3]),
      status: 400,
      code: 'binary-file',
      message: /binary|text/i,
    },
    {
      name: 'no position columns',
      content: 'flux_mjy,detected\n1500,yes\n2500,no\n',
      status: 422,
      code: 'no-position-columns',
      message: /position/i,
    },
    {
      name: 'duplicate header names',
      content: 'GLON,GLAT,GLAT\n1,2,3\n',
      status: 400,
      code: 'duplicate-column',
      message: /GLAT/,
    },
    {
      name: 'the wrong delimiter',
      content: 'GLON|GLAT|VLSR\n1|2|3\n4|5|6\n',
      mapping: {
        position: {
          system: 'galactic',
          lon: { column: 'GLON', unit: 'deg' },
          lat: { column: 'GLAT', unit: 'deg' },
        },
      },
      status: 400,
      message: /delimiter|column/i,
    },
    {
      name: 'an unknown unit',
      content: 'GLON,GLAT,VLSR\n1,2,3\n',
      mapping: {
        position: {
          system: 'galactic',
          lon: { column: 'GLON', unit: 'furlong' },
          lat: { column: 'GLAT', unit: 'deg' },
        },
      },
      status: 400,
      message: /unit|furlong/i,
    },
  ];

  for (const bad of badFiles) {
    it(`refuses ${bad.name} with a clear error and stores nothing`, async () => {
      const before = await owner.json<{ catalogs: unknown[] }>(
        'GET',
        `/api/projects/${projectId}/catalogs`,
      );
      const up = await upload(owner, projectId, { content: bad.content, mapping: bad.mapping });
      expect(up.status).toBe(bad.status);
      if (bad.code) expect(up.body.error.code).toBe(bad.code);
      expect(up.body.error.message).toMatch(bad.message);
      const after = await owner.json<{ catalogs: unknown[] }>(
        'GET',
        `/api/projects/${projectId}/catalogs`,
      );
      expect(after.body.catalogs.length).toBe(before.body.catalogs.length);
    });
  }

  it('rejects RA hours ≥ 24 and rows with too few fields, row by row', async () => {
    const csv = 'RA_HOURS,DEC_DEG,NAME\n12.5,-20,ok-1\n24.5,-20,bad-ra\n13.1\n';
    const up = await upload(owner, projectId, {
      content: csv,
      mapping: {
        position: {
          system: 'equatorial',
          lon: { column: 'RA_HOURS', unit: 'hours' },
          lat: { column: 'DEC_DEG', unit: 'deg' },
        },
        name: { column: 'NAME' },
      },
    });
    const c = await waitForCatalog(owner, up.body.catalog.id);
    expect(c.status).toBe('ready');
    expect(c.rowCount).toBe(1);
    expect(c.rejected!.map((r) => r.line)).toEqual([3, 4]);
    expect(c.rejected![0].reason).toMatch(/24\.5/);
  });

  it('answers 413 past the upload limit and keeps serving', async () => {
    const big = Buffer.alloc(6 * 1024 * 1024, '1,2,3\n');
    const up = await upload(owner, projectId, {
      content: Buffer.concat([Buffer.from('GLON,GLAT,VLSR\n'), big]),
    });
    expect(up.status).toBe(413);
    expect((await owner.get('/api/health')).status).toBe(200);
  });

  it('previews the start of a file with a suggested mapping', async () => {
    const form = new FormData();
    form.set('file', new Blob([planeCsv(30)]), 'p.csv');
    const res = await owner.request('POST', `/api/projects/${projectId}/catalogs/preview`, form);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.preview.columns.map((c: { name: string }) => c.name)).toEqual([
      'GLON',
      'GLAT',
      'VLSR',
      'NAME',
    ]);
    expect(body.preview.rows[0].line).toBe(3);
    expect(body.suggestion.positionUnambiguous).toBe(true);
    expect(body.suggestion.mapping.position.system).toBe('galactic');
  });
});

describe('catalog endpoints by role', () => {
  let t: Team;
  let catalogId: string;
  beforeAll(async () => {
    t = await makeTeam('catroles');
    const up = await upload(t.editor, t.projectId, { content: planeCsv(20) });
    catalogId = up.body.catalog.id;
    await waitForCatalog(t.editor, catalogId);
  });

  it('viewers read, page and export; they may not upload or delete', async () => {
    expect((await t.viewer.get(`/api/projects/${t.projectId}/catalogs`)).status).toBe(200);
    expect((await t.viewer.get(`/api/catalogs/${catalogId}/rows`)).status).toBe(200);
    expect((await t.viewer.get(`/api/catalogs/${catalogId}/export.csv`)).status).toBe(200);
    expect((await upload(t.viewer, t.projectId, { content: planeCsv(5) })).status).toBe(403);
    expect((await t.viewer.delete(`/api/catalogs/${catalogId}`)).status).toBe(403);
  });

  it('outsiders get 404 and anonymous callers 401', async () => {
    expect((await t.outsider.get(`/api/catalogs/${catalogId}`)).status).toBe(404);
    expect((await t.outsider.get(`/api/catalogs/${catalogId}/rows`)).status).toBe(404);
    expect((await upload(t.outsider, t.projectId, { content: planeCsv(5) })).status).toBe(404);
    expect((await t.anonymous.get(`/api/catalogs/${catalogId}`)).status).toBe(401);
  });

  it('editors delete', async () => {
    expect((await t.editor.delete(`/api/catalogs/${catalogId}`)).status).toBe(204);
    expect((await t.editor.get(`/api/catalogs/${catalogId}`)).status).toBe(404);
  });
});

describe('a worker killed in the middle of an ingest', () => {
  it('leaves no partial catalog; the ingest runs again and stores every row once', async () => {
    const { client } = await newUser('cat-crash');
    const p = await client.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Crash ingest',
    });
    const up = await upload(client, p.body.project.id, {
      content: planeCsv(110_000),
      name: 'Big plane',
    });
    expect(up.status).toBe(202);
    const id = up.body.catalog.id;
    const conn = await mysql.createConnection(process.env.DATABASE_URL!);
    try {
      let pid = 0;
      for (let i = 0; i < 600 && !pid; i++) {
        const [[job]] = (await conn.query(
          "SELECT j.locked_by, j.progress FROM jobs j JOIN catalogs c ON c.job_id = j.id WHERE c.id = ? AND j.status = 'running'",
          [id],
        )) as unknown as [[{ locked_by: string; progress: number }?]];
        const [[cat]] = (await conn.query('SELECT progress FROM catalogs WHERE id = ?', [
          id,
        ])) as unknown as [[{ progress: number }]];
        if (job && cat.progress > 0.05) pid = Number(job.locked_by.split(':').pop());
        else await new Promise((res) => setTimeout(res, 20));
      }
      if (!pid) throw new Error('never caught the ingest part-way');
      process.kill(pid, 'SIGKILL');
      const mid = await client.json<{ catalog: { status: string } }>('GET', `/api/catalogs/${id}`);
      expect(mid.body.catalog.status).toBe('ingesting');
      expect((await client.get(`/api/catalogs/${id}/rows`)).status).toBe(409);
      const done = await waitForCatalog(client, id, 120_000);
      expect(done.status).toBe('ready');
      expect(done.rowCount).toBe(110_000);
      const all = await client.json<{ total: number; rows: { row: number }[] }>(
        'GET',
        `/api/catalogs/${id}/rows?sort=row&dir=desc&pageSize=1`,
      );
      expect(all.body.total).toBe(110_000);
      expect(all.body.rows[0].row).toBe(110_000);
    } finally {
      await conn.end();
    }
  }, 180_000);
});
