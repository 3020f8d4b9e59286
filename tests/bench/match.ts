/**
 * Cross-match benchmark. Prints one JSON line {"pairs", "seconds", "peakRssMb"}; `seconds` covers
 * building B's index and matching (not reading or generating the catalogs).
 *
 *   npm run bench:match -- --a A.csv --b B.csv --radius-arcsec 60 --dv-kms 5 [--out-pairs P.csv]
 *   npm run bench:match -- --generate 1000000 [--seed 1] [--out-dir DIR] --radius-arcsec 60 --dv-kms 5
 *
 * CSV files have the header `l,b,v` (Galactic degrees, LSR km/s). `--generate N` makes two random
 * Galactic-plane catalogs of N sources (l uniform in [0, 360), b uniform in [−5, 5], v uniform in
 * [−100, 150] km/s), written to DIR/A.csv and DIR/B.csv when `--out-dir` is given. `--out-pairs`
 * writes the linked row pairs (0-based `ia,ib`, sorted) for comparison with another engine.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { buildSkyIndex, matchCatalogs, type SourceArrays } from '@/lib/match';

type Args = Map<string, string>;

function parseArgs(argv: string[]): Args {
  const args: Args = new Map();
  for (let k = 0; k < argv.length; k++) {
    const key = argv[k];
    if (!key.startsWith('--')) throw new Error(`unexpected argument ${JSON.stringify(key)}`);
    const value = argv[k + 1];
    if (value === undefined || value.startsWith('--')) throw new Error(`${key} needs a value`);
    args.set(key.slice(2), value);
    k++;
  }
  return args;
}

function numberArg(args: Args, name: string, fallback?: number): number {
  const raw = args.get(name);
  if (raw === undefined) {
    if (fallback === undefined) throw new Error(`--${name} is required`);
    return fallback;
  }
  const value = Number(raw);
  if (!Number.isFinite(value))
    throw new Error(`--${name} must be a number, got ${JSON.stringify(raw)}`);
  return value;
}

function readCatalog(file: string): SourceArrays {
  const text = readFileSync(file, 'utf8');
  let pos = text.indexOf('\n');
  const header = (pos < 0 ? text : text.slice(0, pos)).trim().toLowerCase();
  if (header !== 'l,b,v')
    throw new Error(`${file} line 1: expected the header "l,b,v", got ${JSON.stringify(header)}`);
  let rows = 1;
  for (let at = text.indexOf('\n'); at >= 0; at = text.indexOf('\n', at + 1)) rows++;
  let l = new Float64Array(rows);
  let b = new Float64Array(rows);
  let v = new Float64Array(rows);
  let n = 0;
  let line = 1;
  while (pos >= 0 && pos < text.length - 1) {
    const start = pos + 1;
    pos = text.indexOf('\n', start);
    const row = text.slice(start, pos < 0 ? text.length : pos).trim();
    line++;
    if (row === '') continue;
    const fields = row.split(',');
    const values = fields.map(Number);
    if (fields.length !== 3 || !values.every((x) => Number.isFinite(x))) {
      throw new Error(
        `${file} line ${line}: expected three numbers l,b,v, got ${JSON.stringify(row)}`,
      );
    }
    l[n] = values[0];
    b[n] = values[1];
    v[n] = values[2];
    n++;
  }
  l = l.slice(0, n);
  b = b.slice(0, n);
  v = v.slice(0, n);
  return { lDeg: l, bDeg: b, vKms: v };
}

/** Mulberry32: a small seeded generator, uniform in [0, 1). */
function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random plane catalog; values are rounded as written so files and memory agree. */
function generateCatalog(n: number, random: () => number): { src: SourceArrays; csv: string[] } {
  const lDeg = new Float64Array(n);
  const bDeg = new Float64Array(n);
  const vKms = new Float64Array(n);
  const csv = ['l,b,v'];
  for (let i = 0; i < n; i++) {
    const l = (random() * 360).toFixed(6);
    const b = (random() * 10 - 5).toFixed(6);
    const v = (random() * 250 - 100).toFixed(3);
    lDeg[i] = Number(l) >= 360 ? 0 : Number(l);
    bDeg[i] = Number(b);
    vKms[i] = Number(v);
    csv.push(`${lDeg[i] === 0 ? '0.000000' : l},${b},${v}`);
  }
  return { src: { lDeg, bDeg, vKms }, csv };
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2));
  const radiusArcsec = numberArg(args, 'radius-arcsec');
  const dvKms = numberArg(args, 'dv-kms');
  let a: SourceArrays;
  let b: SourceArrays;
  if (args.has('generate')) {
    const n = numberArg(args, 'generate');
    const random = mulberry32(numberArg(args, 'seed', 1));
    const genA = generateCatalog(n, random);
    const genB = generateCatalog(n, random);
    a = genA.src;
    b = genB.src;
    const outDir = args.get('out-dir');
    if (outDir) {
      mkdirSync(outDir, { recursive: true });
      writeFileSync(path.join(outDir, 'A.csv'), genA.csv.join('\n') + '\n');
      writeFileSync(path.join(outDir, 'B.csv'), genB.csv.join('\n') + '\n');
    }
  } else {
    const fileA = args.get('a');
    const fileB = args.get('b');
    if (!fileA || !fileB) throw new Error('give --a A.csv --b B.csv, or --generate N');
    a = readCatalog(fileA);
    b = readCatalog(fileB);
  }

  const t0 = performance.now();
  const indexB = buildSkyIndex(b);
  const links = await matchCatalogs(
    a,
    b,
    {
      radius: { mode: 'fixed', arcsec: radiusArcsec },
      velocity: { mode: 'fixed', kms: dvKms },
      linkMode: 'all',
      missingVelocity: 'exclude',
    },
    { indexB },
  );
  const seconds = (performance.now() - t0) / 1000;
  const peakRssMb = process.resourceUsage().maxRSS / 1024;

  const outPairs = args.get('out-pairs');
  if (outPairs) {
    const lines = ['ia,ib'];
    for (let k = 0; k < links.count; k++) lines.push(`${links.indexA[k]},${links.indexB[k]}`);
    writeFileSync(outPairs, lines.join('\n') + '\n');
  }
  console.log(
    JSON.stringify({
      pairs: links.count,
      seconds: Number(seconds.toFixed(3)),
      peakRssMb: Number(peakRssMb.toFixed(1)),
    }),
  );
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
