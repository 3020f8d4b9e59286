/**
 * The Target section of a project's settings as text fields, and its check: the fields are read
 * into a `ProjectTarget` and checked with the server's own `projectTargetSchema`, so the browser
 * refuses exactly what the endpoint would. Every problem names its field.
 */
import { CoordinateParseError, parseDecDeg, parseRaDeg } from '@/lib/astro/coordinates';
import { projectTargetSchema, type ProjectTarget } from '@/lib/schemas/analyses';

import type { ExternalTarget } from './target';

type Galaxy = ExternalTarget['galaxy'];

/** The form's state: every number as typed. */
export type TargetDraft = {
  kind: ProjectTarget['kind'];
  name: string;
  centerRa: string;
  centerDec: string;
  distanceMpc: string;
  inclinationDeg: string;
  positionAngleDeg: string;
  rotation: Galaxy['rotation'];
  curveKind: Galaxy['rotationCurve']['kind'];
  vFlatKms: string;
  /** One "R V" row per line (kpc, km/s), separated by spaces, commas or tabs. */
  curveTable: string;
  systemicVelocityKms: string;
};

/** Field labels, shared by the form and the messages that name them. */
export const TARGET_LABELS = {
  name: 'Galaxy name',
  centerRa: 'Centre RA (J2000)',
  centerDec: 'Centre Dec (J2000)',
  distanceMpc: 'Distance (Mpc)',
  inclinationDeg: 'Inclination i (°)',
  positionAngleDeg: 'Position angle of the receding major axis (°, east of north)',
  rotation: 'Sense of rotation on the sky',
  vFlatKms: 'Flat rotation speed V (km/s)',
  curveTable: 'Rotation curve table: R (kpc) and V (km/s), one row per line',
  systemicVelocityKms: 'Systemic velocity (km/s, heliocentric, optional)',
} as const;

const BLANK: TargetDraft = {
  kind: 'milky-way',
  name: '',
  centerRa: '',
  centerDec: '',
  distanceMpc: '',
  inclinationDeg: '',
  positionAngleDeg: '',
  rotation: 'counterclockwise',
  curveKind: 'flat',
  vFlatKms: '',
  curveTable: '',
  systemicVelocityKms: '',
};

/** A saved number as the form shows it: 12 significant digits hide the binary tail of a parsed sexagesimal angle. */
const shown = (x: number) => String(Number(x.toPrecision(12)));

/** The draft of a saved target; an absent or unreadable one is the Milky Way. */
export function draftFromTarget(saved: unknown): TargetDraft {
  const parsed = projectTargetSchema.safeParse(saved);
  if (!parsed.success || parsed.data.kind === 'milky-way') return { ...BLANK };
  const { name, galaxy: g } = parsed.data;
  const curve = g.rotationCurve;
  return {
    kind: 'external-galaxy',
    name: name ?? '',
    centerRa: shown(g.centerRaDeg),
    centerDec: shown(g.centerDecDeg),
    distanceMpc: shown(g.distanceMpc),
    inclinationDeg: shown(g.inclinationDeg),
    positionAngleDeg: shown(g.positionAngleDeg),
    rotation: g.rotation,
    curveKind: curve.kind,
    vFlatKms: curve.kind === 'flat' ? shown(curve.vKms) : '',
    curveTable: curve.kind === 'table' ? curve.points.map(([R, V]) => `${R} ${V}`).join('\n') : '',
    systemicVelocityKms: g.systemicVelocityKms === undefined ? '' : shown(g.systemicVelocityKms),
  };
}

export type CheckedTarget = { ok: true; value: ProjectTarget } | { ok: false; problems: string[] };

/** Schema paths under `galaxy` → the form's field labels. */
const PATH_LABELS: Record<string, string> = {
  name: TARGET_LABELS.name,
  'galaxy.centerRaDeg': TARGET_LABELS.centerRa,
  'galaxy.centerDecDeg': TARGET_LABELS.centerDec,
  'galaxy.distanceMpc': TARGET_LABELS.distanceMpc,
  'galaxy.inclinationDeg': TARGET_LABELS.inclinationDeg,
  'galaxy.positionAngleDeg': TARGET_LABELS.positionAngleDeg,
  'galaxy.rotation': TARGET_LABELS.rotation,
  'galaxy.rotationCurve.vKms': TARGET_LABELS.vFlatKms,
  'galaxy.rotationCurve.points': TARGET_LABELS.curveTable,
  'galaxy.systemicVelocityKms': TARGET_LABELS.systemicVelocityKms,
};

function labelOfPath(path: PropertyKey[]): string {
  const key = path.map(String).join('.');
  if (PATH_LABELS[key]) return PATH_LABELS[key];
  const row = key.match(/^galaxy\.rotationCurve\.points\.(\d+)\.([01])$/);
  if (row)
    return `${TARGET_LABELS.curveTable}, row ${Number(row[1]) + 1} ${row[2] === '0' ? 'R' : 'V'}`;
  return key || 'target';
}

/**
 * Reads the draft into a target and checks it with `projectTargetSchema`. Returns the target, or
 * the problems, each starting with the label of its field.
 */
export function checkTargetDraft(draft: TargetDraft): CheckedTarget {
  if (draft.kind === 'milky-way') return { ok: true, value: { kind: 'milky-way' } };
  const problems: string[] = [];
  const number = (field: keyof typeof TARGET_LABELS, text: string): number => {
    const t = text.trim();
    const v = Number(t);
    if (t === '' || !Number.isFinite(v)) {
      problems.push(
        `${TARGET_LABELS[field]}: ${t === '' ? 'give a number' : `“${t}” is not a number`}.`,
      );
      return NaN;
    }
    return v;
  };
  const angle = (field: 'centerRa' | 'centerDec', text: string): number => {
    if (text.trim() === '') {
      problems.push(`${TARGET_LABELS[field]}: give degrees or sexagesimal.`);
      return NaN;
    }
    try {
      return field === 'centerRa' ? parseRaDeg(text.trim()) : parseDecDeg(text.trim());
    } catch (e) {
      const why = e instanceof CoordinateParseError ? e.message : String(e);
      problems.push(`${TARGET_LABELS[field]}: ${why}.`);
      return NaN;
    }
  };
  const galaxy: Galaxy = {
    centerRaDeg: angle('centerRa', draft.centerRa),
    centerDecDeg: angle('centerDec', draft.centerDec),
    distanceMpc: number('distanceMpc', draft.distanceMpc),
    inclinationDeg: number('inclinationDeg', draft.inclinationDeg),
    positionAngleDeg: number('positionAngleDeg', draft.positionAngleDeg),
    rotation: draft.rotation,
    rotationCurve:
      draft.curveKind === 'flat'
        ? { kind: 'flat', vKms: number('vFlatKms', draft.vFlatKms) }
        : { kind: 'table', points: tableRows(draft.curveTable, problems) },
  };
  if (draft.systemicVelocityKms.trim() !== '')
    galaxy.systemicVelocityKms = number('systemicVelocityKms', draft.systemicVelocityKms);
  if (problems.length) return { ok: false, problems };
  const target = {
    kind: 'external-galaxy' as const,
    ...(draft.name.trim() ? { name: draft.name.trim() } : {}),
    galaxy,
  };
  const parsed = projectTargetSchema.safeParse(target);
  if (!parsed.success)
    return {
      ok: false,
      problems: parsed.error.issues.map((i) => `${labelOfPath(i.path)}: ${i.message}`),
    };
  const points = galaxy.rotationCurve.kind === 'table' ? galaxy.rotationCurve.points : [];
  // The analysis reads the table by interpolation, which needs radii in increasing order.
  for (let k = 1; k < points.length; k++)
    if (!(points[k][0] > points[k - 1][0]))
      return {
        ok: false,
        problems: [
          `${TARGET_LABELS.curveTable}, row ${k + 1}: R = ${points[k][0]} kpc must exceed the previous row’s ${points[k - 1][0]} kpc.`,
        ],
      };
  return { ok: true, value: parsed.data };
}

function tableRows(text: string, problems: string[]): [number, number][] {
  const rows: [number, number][] = [];
  text
    .split(/\r?\n/)
    .map((line) => line.trim())
    .forEach((line, k) => {
      if (line === '') return;
      const cells = line.split(/[\s,;]+/);
      const [R, V] = cells.map(Number);
      if (cells.length !== 2 || !Number.isFinite(R) || !Number.isFinite(V))
        problems.push(
          `${TARGET_LABELS.curveTable}, line ${k + 1}: “${line}” is not two numbers (R V).`,
        );
      else rows.push([R, V]);
    });
  return rows;
}
