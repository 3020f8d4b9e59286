/**
 * Star-forming complexes: where they are born on the arms, how far they have moved through the
 * pattern, and which tracers they show at their age. A complex is born where gas enters an arm
 * (phase τ_birth before the ridge crossing); after an age a it sits at phase τ = τ_birth + a,
 * i.e. at azimuth offset Δβ = (Ω(R) − Ω_p)·τ from the ridge. Gas (CO, HI) thins with age and is
 * dispersed soon after the star-formation delay; HII regions appear after the delay and fade
 * after their lifetime; OB associations appear after the delay and stay. The stated order is
 * reversed outside corotation because Ω − Ω_p changes sign there.
 */
import { armRadiusKpc } from '@/lib/astro/arms';
import { fromGalactocentric, polarToXy, ROTATION_SENSE } from '@/lib/astro/galactocentric';
import { azimuthOffsetForPhaseDeg, type GalaxyModel } from './model';
import { sigmaFromHwhm, TRACERS, type PhaseParams, type Tracer } from './params';
import { bernoulli, poisson, uniform, type Rng } from './random';

/** The complexes, one entry per complex in each array. Angles deg, lengths kpc, times Myr. */
export type ComplexTable = {
  count: number;
  armIndex: Int8Array;
  /** Radius of the complex (that of the ridge point it was born beside). */
  RKpc: Float64Array;
  /** Azimuth of the ridge at that radius, and of the complex centre. */
  betaRidgeDeg: Float64Array;
  betaDeg: Float64Array;
  xKpc: Float64Array;
  yKpc: Float64Array;
  zKpc: Float64Array;
  /** Age since birth, and phase relative to the ridge crossing. */
  ageMyr: Float64Array;
  phaseMyr: Float64Array;
  /** Injected azimuthal offset of the centre from the ridge, deg (positive = ahead). */
  azimuthOffsetDeg: Float64Array;
  /** Systemic random line-of-sight velocity, km/s. */
  vRandomKms: Float64Array;
  /** Members per tracer class. */
  members: Record<Tracer, Uint16Array>;
};

type Plan = {
  armIndex: number;
  RKpc: number;
  betaRidgeDeg: number;
  betaDeg: number;
  xKpc: number;
  yKpc: number;
  zKpc: number;
  ageMyr: number;
  phaseMyr: number;
  azimuthOffsetDeg: number;
  vRandomKms: number;
  members: Record<Tracer, number>;
};

/**
 * Share of a complex's initial gas left at ageMyr: linear from 1 at birth to gasAtDelay at the
 * star-formation delay, then linear to 0 over the dispersal time.
 */
function gasFraction(ph: PhaseParams, ageMyr: number): number {
  const delay = ph.starFormationDelayMyr;
  if (ageMyr < delay) return 1 - ((1 - ph.gasAtDelay) * ageMyr) / delay;
  const left = 1 - (ageMyr - delay) / ph.gasDispersalMyr;
  return left > 0 ? ph.gasAtDelay * left : 0;
}

/** Draws one complex: birth point on an arm, age and phase, height, velocity and member counts. */
function planComplex(model: GalaxyModel, rng: Rng): Plan {
  const { params, R0Kpc } = model;
  const ph = params.phase;
  const zSigmaKpc = sigmaFromHwhm(params.complexHwhmPc) / 1000;
  for (;;) {
    const armIndex = rng.int(params.arms.length);
    const arm = params.arms[armIndex];
    const betaRidgeDeg = uniform(rng, arm.betaMinDeg, arm.betaMaxDeg);
    const RKpc = armRadiusKpc(arm, betaRidgeDeg);
    const ageMyr = uniform(rng, 0, ph.maxAgeMyr);
    const phaseMyr = ph.birthPhaseMyr + ph.birthJitterMyr * rng.normal() + ageMyr;
    const azimuthOffsetDeg = azimuthOffsetForPhaseDeg(model, RKpc, phaseMyr);
    const betaDeg = betaRidgeDeg + ROTATION_SENSE * azimuthOffsetDeg;
    const { xKpc, yKpc } = polarToXy(RKpc, betaDeg);
    const zKpc = zSigmaKpc * rng.normal();
    const vRandomKms = params.complexVelSigmaKms * rng.normal();
    const gas = gasFraction(ph, ageMyr);
    const stars = ageMyr >= ph.starFormationDelayMyr;
    const hiiOn = stars && ageMyr < ph.starFormationDelayMyr + ph.hiiLifetimeMyr;
    const members: Record<Tracer, number> = {
      CO: gas > 0 ? 1 + poisson(rng, ph.coMeanExtra * gas) : 0,
      HI: poisson(rng, ph.hiMean * gas),
      HII: hiiOn ? 1 + poisson(rng, ph.hiiMeanExtra) : 0,
      OB: stars && bernoulli(rng, ph.obProbability) ? 1 : 0,
    };
    if (TRACERS.every((t) => members[t] === 0)) continue;
    if (fromGalactocentric(xKpc, yKpc, zKpc, R0Kpc).distKpc < params.minDistKpc) continue;
    return {
      armIndex,
      RKpc,
      betaRidgeDeg,
      betaDeg,
      xKpc,
      yKpc,
      zKpc,
      ageMyr,
      phaseMyr,
      azimuthOffsetDeg,
      vRandomKms,
      members,
    };
  }
}

function rowsOf(plan: Plan): number {
  return TRACERS.reduce((sum, t) => sum + plan.members[t], 0);
}

/**
 * Plans complexes: exactly `count` of them, or, when `maxRows` is given instead, as many as fit
 * (in draw order) without their members exceeding maxRows rows.
 */
export function planComplexes(
  model: GalaxyModel,
  rng: Rng,
  limit: { count: number } | { maxRows: number },
): ComplexTable {
  const plans: Plan[] = [];
  if ('count' in limit) {
    for (let k = 0; k < limit.count; k++) plans.push(planComplex(model, rng));
  } else {
    let rows = 0;
    for (;;) {
      const plan = planComplex(model, rng);
      rows += rowsOf(plan);
      if (rows > limit.maxRows) break;
      plans.push(plan);
    }
  }
  return toTable(plans);
}

function toTable(plans: Plan[]): ComplexTable {
  const n = plans.length;
  const f = (key: keyof Omit<Plan, 'members' | 'armIndex'>) =>
    Float64Array.from(plans, (p) => p[key]);
  const members = {} as Record<Tracer, Uint16Array>;
  for (const t of TRACERS) members[t] = Uint16Array.from(plans, (p) => p.members[t]);
  return {
    count: n,
    armIndex: Int8Array.from(plans, (p) => p.armIndex),
    RKpc: f('RKpc'),
    betaRidgeDeg: f('betaRidgeDeg'),
    betaDeg: f('betaDeg'),
    xKpc: f('xKpc'),
    yKpc: f('yKpc'),
    zKpc: f('zKpc'),
    ageMyr: f('ageMyr'),
    phaseMyr: f('phaseMyr'),
    azimuthOffsetDeg: f('azimuthOffsetDeg'),
    vRandomKms: f('vRandomKms'),
    members,
  };
}
