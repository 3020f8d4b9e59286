/**
 * writeDemoFiles: writes a generated galaxy as the four survey files, the per-source truth CSVs,
 * the complexes truth CSV and truth.json into a directory (created if missing), streaming every
 * file.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { DemoGalaxy } from './galaxy';
import { CO_LAYOUT, HI_LAYOUT, HII_LAYOUT, TEXT_LAYOUTS, type TextLayout } from './layouts';
import { OB_FILE_NAME, OB_FIELDS, obVotableChunks } from './ob-votable';
import { TRACERS, type Tracer } from './params';
import { lineChunks, writeChunks } from './text-file';
import { complexTruthRows, sourceTruthRows } from './truth-files';

/** One written file. */
export type WrittenFile = { file: string; rows: number; bytes: number };

/** What writeDemoFiles wrote, by role. */
export type WrittenDemo = {
  dir: string;
  catalogs: Record<Tracer, WrittenFile>;
  truth: { json: WrittenFile; sources: Record<Tracer, WrittenFile>; complexes: WrittenFile };
};

/** File name of the per-source truth CSV of a tracer class. */
export function truthFileName(tracer: Tracer): string {
  return `truth-${tracer.toLowerCase()}.csv`;
}
export const COMPLEX_TRUTH_FILE = 'truth-complexes.csv';
export const TRUTH_JSON_FILE = 'truth.json';

function layoutDescription(layout: TextLayout) {
  return {
    file: layout.fileName,
    format: layout.delimiter === ',' ? 'CSV' : `text, delimiter "${layout.delimiter}"`,
    commentLines: layout.comments.length,
    columns: layout.columns.map(({ name, unit, meaning }) => ({ name, unit, meaning })),
  };
}

/**
 * Writes `galaxy` into `dir`: hrg-hi-clouds.csv, hrg-co-clouds.txt, hrg-hii-regions.csv,
 * hrg-ob-associations.vot, truth-{hi,co,hii,ob}.csv, truth-complexes.csv and truth.json (the
 * galaxy's truth plus a description of every file). Returns names, row counts and sizes.
 */
export async function writeDemoFiles(galaxy: DemoGalaxy, dir: string): Promise<WrittenDemo> {
  await mkdir(dir, { recursive: true });
  const { catalogs, complexes, truth } = galaxy;
  const written = {} as Record<Tracer, WrittenFile>;
  for (const layout of TEXT_LAYOUTS) {
    const cat = catalogs[layout.tracer];
    const d = layout.delimiter;
    const head = [...layout.comments, layout.columns.map((c) => c.name).join(d)];
    const bytes = await writeChunks(
      join(dir, layout.fileName),
      lineChunks(head, cat.count, (i) => layout.columns.map((c) => c.text(cat, i)).join(d)),
    );
    written[layout.tracer] = { file: layout.fileName, rows: cat.count, bytes };
  }
  written.OB = {
    file: OB_FILE_NAME,
    rows: catalogs.OB.count,
    bytes: await writeChunks(join(dir, OB_FILE_NAME), obVotableChunks(catalogs.OB)),
  };

  const sources = {} as Record<Tracer, WrittenFile>;
  for (const t of TRACERS) {
    const file = truthFileName(t);
    const { header, line } = sourceTruthRows(catalogs[t], truth.model);
    const bytes = await writeChunks(join(dir, file), lineChunks([header], catalogs[t].count, line));
    sources[t] = { file, rows: catalogs[t].count, bytes };
  }
  const cx = complexTruthRows(complexes, truth.model);
  const complexesFile: WrittenFile = {
    file: COMPLEX_TRUTH_FILE,
    rows: complexes.count,
    bytes: await writeChunks(
      join(dir, COMPLEX_TRUTH_FILE),
      lineChunks([cx.header], complexes.count, cx.line),
    ),
  };

  const json = JSON.stringify(
    {
      ...truth,
      files: {
        catalogs: {
          HI: layoutDescription(HI_LAYOUT),
          CO: layoutDescription(CO_LAYOUT),
          HII: layoutDescription(HII_LAYOUT),
          OB: { file: OB_FILE_NAME, format: 'VOTable 1.4 (TABLEDATA)', fields: OB_FIELDS },
        },
        sourceTruth: Object.fromEntries(TRACERS.map((t) => [t, truthFileName(t)])),
        complexTruth: COMPLEX_TRUTH_FILE,
        note: 'Row k of truth-<class>.csv describes row k of that class catalog (same name).',
      },
    },
    null,
    2,
  );
  await writeFile(join(dir, TRUTH_JSON_FILE), json + '\n', 'utf8');
  return {
    dir,
    catalogs: written,
    truth: {
      json: { file: TRUTH_JSON_FILE, rows: 1, bytes: Buffer.byteLength(json) + 1 },
      sources,
      complexes: complexesFile,
    },
  };
}
