/**
 * The ordering settings as the form edits them (text fields, so a half-typed number is kept)
 * and their conversion to and from the API's `settings.ordering` shape. Checking happens here so
 * the form, the preview map and the run button agree on what is valid; every message names the
 * field and the offending value.
 */
import { armPoints, type ArmSpec } from '@/lib/astro/arms';
import type { RotationCurve } from '@/lib/astro/rotation-curves';
import { toolCurve, type ToolCurveName } from '@/lib/calculators';
import { NEAR_FAR_RULES } from '@/lib/schemas/analyses';
import type {
  ArmPresets,
  ArmsChoice,
  CurvePreset,
  CustomArmJson,
  NearFarRule,
  OrderingDefaults,
} from './types';

/** One custom arm row: name, R_ref (kpc), β_ref, pitch ψ, β_min and β_max (deg), as typed. */
export interface ArmRowDraft {
  name: string;
  Rref: string;
  betaRefDeg: string;
  pitchDeg: string;
  betaMinDeg: string;
  betaMaxDeg: string;
}

export interface SettingsDraft {
  curveName: ToolCurveName;
  R0: string;
  theta0: string;
  /** 1σ of R0 (kpc) and Θ0 (km/s) drawn in the distance Monte Carlo. */
  R0Err: string;
  theta0Err: string;
  /** An assumed pattern speed (km/s/kpc); empty: none is assumed. */
  patternSpeed: string;
  nearFar: NearFarRule;
  sigmaStreamKms: string;
  scaleHeightKpc: string;
  armWidthKpc: string;
  velocityFrom: 'gas' | 'all';
  armsMode: 'preset' | 'custom';
  preset: string;
  customArms: ArmRowDraft[];
}

/**
 * Defaults for a project that saved none: σ_stream 7 km/s and a young-disc scale height of
 * 0.06 kpc (common practice); no pattern speed is assumed, so one is only ever fitted.
 */
export const FALLBACK_DEFAULTS: OrderingDefaults = {
  curve: { name: 'reid-2014' },
  arms: { preset: 'reid-2014' },
  patternSpeed: null,
  nearFar: 'probabilistic',
  armWidthKpc: 1.0,
  sigmaStreamKms: 7,
  scaleHeightKpc: 0.06,
  velocityFrom: 'gas',
};

const text = (x: number) => String(+x.toPrecision(10));

/** A preset's Θ(R0) to the metre per second, as the form shows it. */
export const roundKms = (kms: number) => +kms.toFixed(3);

function armRow(a: CustomArmJson): ArmRowDraft {
  return {
    name: a.name,
    Rref: text(a.Rref),
    betaRefDeg: text(a.betaRefDeg),
    pitchDeg: text(a.pitchDeg),
    betaMinDeg: text(a.betaMinDeg),
    betaMaxDeg: text(a.betaMaxDeg),
  };
}

/** An ArmSpec (without a kink) as a custom-arm row; kinked arms are not representable. */
export function armSpecToRow(a: ArmSpec): ArmRowDraft {
  return armRow({
    name: a.name,
    Rref: a.RrefKpc,
    betaRefDeg: a.betaRefDeg,
    pitchDeg: a.pitchDeg,
    betaMinDeg: a.betaMinDeg,
    betaMaxDeg: a.betaMaxDeg,
  });
}

/** An empty arm row with plausible starting values (a 12° trailing spiral through R = 8 kpc). */
export const NEW_ARM_ROW: ArmRowDraft = {
  name: '',
  Rref: '8',
  betaRefDeg: '0',
  pitchDeg: '12',
  betaMinDeg: '-30',
  betaMaxDeg: '60',
};

/**
 * Reads `project.settings.ordering` (any JSON) over the fallback defaults, key by key. A near/far
 * rule that is not one of the schema's falls back to the default.
 */
export function readDefaults(stored: unknown): OrderingDefaults {
  if (!stored || typeof stored !== 'object') return FALLBACK_DEFAULTS;
  const d = { ...FALLBACK_DEFAULTS, ...(stored as Partial<OrderingDefaults>) };
  if (!(NEAR_FAR_RULES as readonly string[]).includes(d.nearFar))
    d.nearFar = FALLBACK_DEFAULTS.nearFar;
  return d;
}

/** The published 1σ of a preset's R0 (kpc) and Θ0 (km/s) as form text; 0 where none is published. */
export function presetErrors(c: CurvePreset): { R0Err: string; theta0Err: string } {
  return { R0Err: text(c.R0ErrKpc ?? 0), theta0Err: text(c.theta0ErrKms ?? 0) };
}

/** The form state for saved defaults; R0, Θ0 and their 1σ default to the curve preset's values. */
export function draftFromDefaults(d: OrderingDefaults, presets: ArmPresets): SettingsDraft {
  const curve = presets.curves.find((c) => c.name === d.curve.name) ?? presets.curves[0];
  const custom = 'custom' in d.arms ? d.arms.custom : null;
  const published = presetErrors(curve);
  return {
    curveName: curve.name,
    R0: text(d.curve.R0 ?? curve.R0Kpc),
    theta0: text(d.curve.theta0 ?? roundKms(curve.theta0Kms)),
    R0Err: d.curve.R0Err === undefined ? published.R0Err : text(d.curve.R0Err),
    theta0Err: d.curve.theta0Err === undefined ? published.theta0Err : text(d.curve.theta0Err),
    patternSpeed:
      d.patternSpeed === null || d.patternSpeed === undefined ? '' : text(d.patternSpeed),
    nearFar: d.nearFar,
    sigmaStreamKms: text(d.sigmaStreamKms),
    scaleHeightKpc: text(d.scaleHeightKpc),
    armWidthKpc: text(d.armWidthKpc),
    velocityFrom: d.velocityFrom,
    armsMode: custom ? 'custom' : 'preset',
    preset: 'preset' in d.arms ? d.arms.preset : (presets.presets[0]?.key ?? ''),
    customArms: custom ? custom.map(armRow) : [],
  };
}

/** The arms of a choice as ArmSpecs: a preset's own (with kinks), or the custom rows. */
export function armsOfChoice(choice: ArmsChoice, presets: ArmPresets): ArmSpec[] {
  if ('custom' in choice) {
    return choice.custom.map((a) => ({
      name: a.name,
      RrefKpc: a.Rref,
      betaRefDeg: a.betaRefDeg,
      pitchDeg: a.pitchDeg,
      betaMinDeg: a.betaMinDeg,
      betaMaxDeg: a.betaMaxDeg,
    }));
  }
  return presets.presets.find((p) => p.key === choice.preset)?.arms ?? [];
}

/** A checked draft: the API value with its arms and curve, or one message per bad field. */
export type CheckedSettings =
  | { ok: true; value: OrderingDefaults; arms: ArmSpec[]; curve: RotationCurve }
  | { ok: false; errors: Record<string, string>; arms: ArmSpec[] };

/** A closed or open interval of allowed values, with the words an error message uses. */
type Range = { lo: number; hi: number; loOpen?: boolean; hiOpen?: boolean };

const inRange = (x: number, r: Range) =>
  (r.loOpen ? x > r.lo : x >= r.lo) && (r.hiOpen ? x < r.hi : x <= r.hi);
const rangeWords = (r: Range) =>
  `must lie in ${r.loOpen ? '(' : '['}${r.lo}, ${r.hi}${r.hiOpen ? ')' : ']'}`;

/** Limits the analyses endpoint accepts (checked here first so the form can say so at once). */
const LIMITS = {
  R0: { lo: 0, hi: 20, loOpen: true },
  theta0: { lo: 0, hi: 400, loOpen: true },
  R0Err: { lo: 0, hi: 2 },
  theta0Err: { lo: 0, hi: 50 },
  patternSpeed: { lo: 0, hi: 200, loOpen: true },
  sigmaStreamKms: { lo: 0, hi: 50 },
  scaleHeightKpc: { lo: 0, hi: 2, loOpen: true },
  armWidthKpc: { lo: 0, hi: 5, loOpen: true },
  Rref: { lo: 0, hi: 50, loOpen: true },
  pitchDeg: { lo: -60, hi: 60, loOpen: true, hiOpen: true },
  betaDeg: { lo: -720, hi: 720 },
} satisfies Record<string, Range>;

/** Most custom arms one analysis may carry, and the longest arm name. */
const MAX_ARMS = 12;
const MAX_ARM_NAME = 60;

function number(
  errors: Record<string, string>,
  key: string,
  label: string,
  raw: string,
  range: Range,
): number {
  const x = Number(raw.trim());
  if (raw.trim() === '' || !Number.isFinite(x)) errors[key] = `${label}: “${raw}” is not a number.`;
  else if (!inRange(x, range)) errors[key] = `${label}: ${raw} ${rangeWords(range)}.`;
  return x;
}

/**
 * Checks every field of the draft. Arms that are valid on their own are returned even when other
 * fields are not, so the preview map keeps drawing while the user types.
 */
export function checkDraft(d: SettingsDraft, presets: ArmPresets): CheckedSettings {
  const errors: Record<string, string> = {};
  const R0 = number(errors, 'R0', 'R0 (kpc)', d.R0, LIMITS.R0);
  const theta0 = number(errors, 'theta0', 'Θ0 (km/s)', d.theta0, LIMITS.theta0);
  const R0Err = number(errors, 'R0Err', 'R0 uncertainty (kpc)', d.R0Err, LIMITS.R0Err);
  const theta0Err = number(
    errors,
    'theta0Err',
    'Θ0 uncertainty (km/s)',
    d.theta0Err,
    LIMITS.theta0Err,
  );
  // An empty field assumes no pattern speed; a number is an assumption the result labels so.
  const patternSpeed =
    d.patternSpeed.trim() === ''
      ? null
      : number(
          errors,
          'patternSpeed',
          'Assumed pattern speed (km/s/kpc)',
          d.patternSpeed,
          LIMITS.patternSpeed,
        );
  const sigmaStreamKms = number(
    errors,
    'sigmaStreamKms',
    'Streaming σ (km/s)',
    d.sigmaStreamKms,
    LIMITS.sigmaStreamKms,
  );
  const scaleHeightKpc = number(
    errors,
    'scaleHeightKpc',
    'Scale height (kpc)',
    d.scaleHeightKpc,
    LIMITS.scaleHeightKpc,
  );
  const armWidthKpc = number(
    errors,
    'armWidthKpc',
    'Arm width (kpc)',
    d.armWidthKpc,
    LIMITS.armWidthKpc,
  );

  let arms: ArmsChoice;
  let specs: ArmSpec[] = [];
  if (d.armsMode === 'preset') {
    arms = { preset: d.preset };
    specs = armsOfChoice(arms, presets);
    if (specs.length === 0) errors.arms = `Arm model “${d.preset}” is not a known preset.`;
  } else {
    const custom: CustomArmJson[] = [];
    if (d.customArms.length === 0) errors.arms = 'Add at least one arm.';
    if (d.customArms.length > MAX_ARMS)
      errors.arms = `${d.customArms.length} arms; an analysis takes at most ${MAX_ARMS}.`;
    d.customArms.forEach((row, i) => {
      const at = `Arm ${i + 1}${row.name ? ` (“${row.name}”)` : ''}`;
      const e: Record<string, string> = {};
      const field = (key: keyof ArmRowDraft, label: string, range: Range) =>
        number(e, `arm${i}.${key}`, `${at}, ${label}`, row[key], range);
      const a: CustomArmJson = {
        name: row.name.trim(),
        Rref: field('Rref', 'R_ref (kpc)', LIMITS.Rref),
        betaRefDeg: field('betaRefDeg', 'β_ref (°)', LIMITS.betaDeg),
        pitchDeg: field('pitchDeg', 'pitch (°)', LIMITS.pitchDeg),
        betaMinDeg: field('betaMinDeg', 'β from (°)', LIMITS.betaDeg),
        betaMaxDeg: field('betaMaxDeg', 'β to (°)', LIMITS.betaDeg),
      };
      if (!a.name) e[`arm${i}.name`] = `${at}: give the arm a name.`;
      else if (a.name.length > MAX_ARM_NAME)
        e[`arm${i}.name`] = `${at}: the name is longer than ${MAX_ARM_NAME} characters.`;
      else if (d.customArms.findIndex((r) => r.name.trim() === a.name) !== i)
        e[`arm${i}.name`] = `${at}: the name is used by an earlier arm.`;
      if (Object.keys(e).length === 0 && !(a.betaMaxDeg > a.betaMinDeg))
        e[`arm${i}.betaMaxDeg`] =
          `${at}: β to (${a.betaMaxDeg}°) must exceed β from (${a.betaMinDeg}°).`;
      Object.assign(errors, e);
      custom.push(a);
    });
    arms = { custom };
    specs = armsOfChoice(arms, presets).filter((_, i) =>
      Object.keys(errors).every((k) => !k.startsWith(`arm${i}.`)),
    );
  }
  for (const s of specs) {
    try {
      armPoints(s, 5);
    } catch (e) {
      errors.arms = e instanceof Error ? e.message : String(e);
    }
  }

  let curve: RotationCurve | null = null;
  if (!errors.R0 && !errors.theta0) {
    try {
      curve = toolCurve(d.curveName, R0, theta0);
    } catch (e) {
      errors.curve = e instanceof Error ? e.message : String(e);
    }
  }
  if (Object.keys(errors).length > 0 || !curve) return { ok: false, errors, arms: specs };
  return {
    ok: true,
    arms: specs,
    curve,
    value: {
      curve: { name: d.curveName, R0, theta0, R0Err, theta0Err },
      arms,
      patternSpeed,
      nearFar: d.nearFar,
      armWidthKpc,
      sigmaStreamKms,
      scaleHeightKpc,
      velocityFrom: d.velocityFrom,
    },
  };
}

/** The rotation curve an analysis ran with, from its stored params; null if they are unusable. */
export function curveOfParams(c: {
  name: ToolCurveName;
  R0?: number;
  theta0?: number;
}): RotationCurve | null {
  try {
    return toolCurve(c.name, c.R0, c.theta0);
  } catch {
    return null;
  }
}
