/**
 * generateGalaxy: the demo galaxy in memory — complexes with their gas and young-star members,
 * interlopers, and the truth — deterministic for a seed.
 */
import { makeRng } from '@/lib/stats/rng';
import { allocateCatalog, longitudeOrder, permuteCatalog, type TracerCatalog } from './catalog';
import { planComplexes, type ComplexTable } from './complexes';
import { drawInterloperPosition, splitInterlopers } from './interlopers';
import { flowSign, localAxes, makeGalaxyModel, type GalaxyModel } from './model';
import { observeSource } from './observe';
import { resolveOptions, type GalaxyOptions } from './options';
import { TRACERS, type Tracer } from './params';
import type { Rng } from './random';
import { buildTruth, type GalaxyTruth } from './truth';

/** Share of a `rows` target filled by complex members; interlopers fill the rest exactly. */
const ROWS_MEMBER_SHARE = 0.85;

/** A generated galaxy: truth record, the four catalogs (sorted by longitude) and the complexes. */
export type DemoGalaxy = {
  truth: GalaxyTruth;
  catalogs: Record<Tracer, TracerCatalog>;
  complexes: ComplexTable;
};

/**
 * Generates the demo galaxy for `options` (see {@link GalaxyOptions}). The same options give the
 * same galaxy, bit for bit. Throws GeneratorOptionError for invalid options.
 */
export function generateGalaxy(options: GalaxyOptions): DemoGalaxy {
  const resolved = resolveOptions(options);
  const model = makeGalaxyModel(resolved.model);
  const rng = makeRng(resolved.seed);
  const { counts } = resolved;
  const complexes =
    counts.mode === 'fixed'
      ? planComplexes(model, rng, { count: counts.complexes })
      : planComplexes(model, rng, { maxRows: Math.floor(counts.rows * ROWS_MEMBER_SHARE) });
  const memberRows = {} as Record<Tracer, number>;
  for (const t of TRACERS) memberRows[t] = complexes.members[t].reduce((a, b) => a + b, 0);
  const totalMembers = TRACERS.reduce((s, t) => s + memberRows[t], 0);
  const interlopers = splitInterlopers(
    model,
    counts.mode === 'fixed' ? counts.interlopers : counts.rows - totalMembers,
  );

  const catalogs = {} as Record<Tracer, TracerCatalog>;
  for (const t of TRACERS) {
    const cat = allocateCatalog(t, memberRows[t] + interlopers[t]);
    const next = fillMembers(model, rng, cat, complexes);
    fillInterlopers(model, rng, cat, next);
    catalogs[t] = permuteCatalog(cat, longitudeOrder(cat));
  }
  return { truth: buildTruth(resolved, model, complexes, catalogs), catalogs, complexes };
}

/**
 * Writes the members of every complex into `cat` from row 0 and returns the next free row. A
 * member sits at its complex centre shifted by the class's intraShiftPc along the flow through
 * the arm (ahead inside corotation, behind outside), plus isotropic scatter; its random velocity
 * is the complex's systemic one plus the class's member dispersion.
 */
function fillMembers(model: GalaxyModel, rng: Rng, cat: TracerCatalog, cx: ComplexTable): number {
  const tp = model.params.tracers[cat.tracer];
  const counts = cx.members[cat.tracer];
  const scatterKpc = tp.memberScatterPc / 1000;
  let row = 0;
  for (let c = 0; c < cx.count; c++) {
    const n = counts[c];
    if (n === 0) continue;
    const shiftKpc = (flowSign(model, cx.RKpc[c]) * tp.intraShiftPc) / 1000;
    const { ax, ay } = localAxes(cx.betaDeg[c]);
    for (let m = 0; m < n; m++) {
      const pos = {
        xKpc: cx.xKpc[c] + shiftKpc * ax + scatterKpc * rng.normal(),
        yKpc: cx.yKpc[c] + shiftKpc * ay + scatterKpc * rng.normal(),
        zKpc: cx.zKpc[c] + scatterKpc * rng.normal(),
      };
      const vRandom = cx.vRandomKms[c] + tp.memberVelSigmaKms * rng.normal();
      observeSource(model, rng, cat, row++, pos, vRandom, c, cx.phaseMyr[c]);
    }
  }
  return row;
}

/** Fills rows from `start` to the end of `cat` with interlopers of its class. */
function fillInterlopers(model: GalaxyModel, rng: Rng, cat: TracerCatalog, start: number): void {
  const sigma = model.params.interloperVelSigmaKms;
  for (let row = start; row < cat.count; row++) {
    const pos = drawInterloperPosition(model, rng, cat.tracer);
    observeSource(model, rng, cat, row, pos, sigma * rng.normal(), -1, NaN);
  }
}
