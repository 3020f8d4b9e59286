import { mkdtemp, readFile, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  generateGalaxy,
  GeneratorOptionError,
  TRACERS,
  writeDemoFiles,
  type DemoGalaxy,
} from '@/seed/generator';
import { CliUsageError, parseCliArgs } from '@/seed/generator/cli-args';

const dirs: string[] = [];
async function tempDir(): Promise<string> {
  const d = await mkdtemp(join(tmpdir(), 'lanewise-seed-'));
  dirs.push(d);
  return d;
}
afterAll(async () => {
  await Promise.all(dirs.map((d) => rm(d, { recursive: true, force: true })));
});

function columnsOf(g: DemoGalaxy): Record<string, ArrayLike<number>> {
  const out: Record<string, ArrayLike<number>> = {};
  for (const t of TRACERS) {
    for (const [key, value] of Object.entries(g.catalogs[t])) {
      if (ArrayBuffer.isView(value)) out[`${t}.${key}`] = value as unknown as ArrayLike<number>;
    }
  }
  return out;
}

describe('determinism', () => {
  it('gives bit-identical catalogs and files for the same seed', async () => {
    const a = generateGalaxy({ seed: 11, complexes: 120, interlopers: 60 });
    const b = generateGalaxy({ seed: 11, complexes: 120, interlopers: 60 });
    const ca = columnsOf(a);
    const cb = columnsOf(b);
    expect(Object.keys(ca).length).toBeGreaterThan(80);
    for (const key of Object.keys(ca)) {
      expect(Array.from(cb[key]), key).toEqual(Array.from(ca[key]));
    }
    const [da, db] = [await tempDir(), await tempDir()];
    await writeDemoFiles(a, da);
    await writeDemoFiles(b, db);
    const files = (await readdir(da)).sort();
    expect(files).toEqual((await readdir(db)).sort());
    expect(files).toHaveLength(10);
    for (const f of files) {
      expect((await readFile(join(da, f))).equals(await readFile(join(db, f))), f).toBe(true);
    }
  });

  it('gives a different galaxy for a different seed', () => {
    const a = generateGalaxy({ seed: 11, complexes: 50, interlopers: 10 });
    const b = generateGalaxy({ seed: 12, complexes: 50, interlopers: 10 });
    expect(Array.from(a.catalogs.CO.lDeg)).not.toEqual(Array.from(b.catalogs.CO.lDeg));
  });
});

describe('counts', () => {
  it('makes exactly the requested complexes and interlopers', () => {
    const g = generateGalaxy({ seed: 3, complexes: 200, interlopers: 137 });
    expect(g.complexes.count).toBe(200);
    expect(g.truth.counts.complexes).toBe(200);
    expect(g.truth.counts.interlopers).toBe(137);
    const ids = new Set<number>();
    let interlopers = 0;
    for (const t of TRACERS) {
      const cat = g.catalogs[t];
      for (let i = 0; i < cat.count; i++) {
        if (cat.complexId[i] < 0) interlopers++;
        else ids.add(cat.complexId[i]);
      }
    }
    expect(interlopers).toBe(137);
    // Every complex shows at least one tracer (empty ones are redrawn), so every id appears.
    expect(ids.size).toBe(200);
    const rows = TRACERS.reduce((s, t) => s + g.catalogs[t].count, 0);
    expect(g.truth.counts.rows).toBe(rows);
  });

  it('scales complexes and interlopers by --scale', () => {
    const g = generateGalaxy({ seed: 3, complexes: 40, interlopers: 30, scale: 2.5 });
    expect(g.truth.counts.complexes).toBe(100);
    expect(g.truth.counts.interlopers).toBe(75);
  });

  it.each([1, 17, 5000, 20_000])('hits a rows target of %i exactly', (rows) => {
    const g = generateGalaxy({ seed: 5, rows });
    expect(TRACERS.reduce((s, t) => s + g.catalogs[t].count, 0)).toBe(rows);
    expect(g.truth.counts.rows).toBe(rows);
    // Members fill at most 85 % of the target; interlopers the rest.
    expect(g.truth.counts.interlopers).toBeGreaterThanOrEqual(Math.ceil(rows * 0.15));
  });

  it('rejects bad options with the option name and value', () => {
    expect(() => generateGalaxy({ seed: 1, rows: 10, complexes: 5 })).toThrow(/rows .*complexes/);
    expect(() => generateGalaxy({ seed: 1, complexes: -3 })).toThrow(GeneratorOptionError);
    expect(() => generateGalaxy({ seed: 1, complexes: -3 })).toThrow(/complexes = -3/);
    expect(() => generateGalaxy({ seed: 1.5 })).toThrow(/seed = 1.5/);
    expect(() => generateGalaxy({ seed: 1, scale: 0 })).toThrow(/scale = 0/);
  });
});

describe('command-line flags', () => {
  it('reads --flag value and --flag=value', () => {
    expect(
      parseCliArgs(['--seed', '7', '--complexes=300', '--interlopers', '200', '--out', 'x']),
    ).toEqual({
      out: 'x',
      options: { seed: 7, complexes: 300, interlopers: 200, scale: undefined, rows: undefined },
    });
    expect(parseCliArgs(['--out', 'd', '--rows', '2000000']).options.rows).toBe(2_000_000);
  });

  it('names the flag at fault', () => {
    expect(() => parseCliArgs(['--seed', '7'])).toThrow(/--out/);
    expect(() => parseCliArgs(['--out', 'd', '--rows', 'many'])).toThrow(/--rows: "many"/);
    expect(() => parseCliArgs(['--out', 'd', '--colour', '3'])).toThrow(/unknown flag --colour/);
    expect(() => parseCliArgs(['--out', 'd', '--seed'])).toThrow(/--seed needs a value/);
    expect(() => parseCliArgs(['--out', 'd', 'stray'])).toThrow(CliUsageError);
  });
});
