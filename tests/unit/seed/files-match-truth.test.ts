/**
 * The written files agree with the truth: positions recomputed from what a user reads (l, b, or
 * sexagesimal RA/Dec, or VOTable degrees) plus the true distance land on the true Galactocentric
 * position and arm offsets; velocities read back through the lib/astro frame and convention
 * conversions give the generated LSR velocities.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { offsetFromArms } from '@/lib/astro/arms';
import { equatorialToGalactic, parseDecDeg, parseRaDeg } from '@/lib/astro/coordinates';
import { toGalactocentric } from '@/lib/astro/galactocentric';
import { convertVelocityConvention, helioToLsrKms } from '@/lib/astro/velocity';
import {
  DEFAULT_MODEL,
  galaxyCurve,
  generateGalaxy,
  truthFileName,
  writeDemoFiles,
  type DemoGalaxy,
  type Tracer,
} from '@/seed/generator';
import { column, numbers, readDelimited, readVotable, votColumn, type TextTable } from './files';

let dir = '';
let galaxy: DemoGalaxy;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lanewise-seed-'));
  galaxy = generateGalaxy({ seed: 7, complexes: 400, interlopers: 200 });
  await writeDemoFiles(galaxy, dir);
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function truthOf(t: Tracer): Promise<TextTable> {
  return readDelimited(join(dir, truthFileName(t)), ',');
}

/** Checks one catalog's written sky positions against its truth CSV; tolKpc from the written rounding. */
function checkPositions(
  t: Tracer,
  names: string[],
  lDeg: number[],
  bDeg: number[],
  truth: TextTable,
  tolKpc: number,
): void {
  const R0 = galaxy.truth.R0Kpc;
  const arms = galaxy.truth.arms;
  expect(names).toEqual(column(truth, 'name'));
  const dist = numbers(truth, 'dist_kpc');
  const [x, y, z] = ['x_kpc', 'y_kpc', 'z_kpc'].map((c) => numbers(truth, c));
  const arm = numbers(truth, 'arm_index');
  const perp = numbers(truth, 'perp_offset_kpc');
  const az = numbers(truth, 'azimuth_offset_deg');
  expect(names.length).toBe(galaxy.catalogs[t].count);
  for (let i = 0; i < names.length; i++) {
    const p = toGalactocentric(lDeg[i], bDeg[i], dist[i], R0);
    expect(Math.abs(p.xKpc - x[i]), `${names[i]} x`).toBeLessThan(tolKpc);
    expect(Math.abs(p.yKpc - y[i]), `${names[i]} y`).toBeLessThan(tolKpc);
    expect(Math.abs(p.zKpc - z[i]), `${names[i]} z`).toBeLessThan(tolKpc);
    const off = offsetFromArms(p.xKpc, p.yKpc, arms, R0);
    expect(off.armIndex, names[i]).toBe(arm[i]);
    expect(Math.abs(off.perpOffsetKpc - perp[i]), `${names[i]} perp`).toBeLessThan(2 * tolKpc);
    // Azimuth error ≈ position error (≤ 2·tol) / R, and every source has R > 2 kpc.
    expect(Math.abs(off.azimuthOffsetDeg - az[i]), `${names[i]} az`).toBeLessThan(
      tolKpc * (180 / Math.PI),
    );
  }
}

describe('written catalogs against the truth', () => {
  it('HI CSV: GLON/GLAT + true distance give the true position and arm offsets', async () => {
    const hi = await readDelimited(join(dir, 'hrg-hi-clouds.csv'), ',');
    expect(hi.header).toEqual(['GLON', 'GLAT', 'VLSR', 'FWHM_KMS', 'SIZE_ARCMIN', 'NAME']);
    // 5 decimals in l, b: ≤ 5e-6° ≈ 8.7e-8 rad, times ≤ 30 kpc.
    checkPositions(
      'HI',
      column(hi, 'NAME'),
      numbers(hi, 'GLON'),
      numbers(hi, 'GLAT'),
      await truthOf('HI'),
      5e-6,
    );
    const v = numbers(hi, 'VLSR');
    v.forEach((vi, i) =>
      expect(Math.abs(vi - galaxy.catalogs.HI.vLsrKms[i])).toBeLessThanOrEqual(0.005 + 1e-9),
    );
  });

  it('CO semicolon file with # header: l_deg/b_deg + true distance give the truth', async () => {
    const co = await readDelimited(join(dir, 'hrg-co-clouds.txt'), ';');
    expect(co.comments.length).toBeGreaterThan(0);
    expect(co.header).toEqual([
      'l_deg',
      'b_deg',
      'v_lsr_kms',
      'sigma_v',
      'radius_arcsec',
      'cloud_id',
    ]);
    checkPositions(
      'CO',
      column(co, 'cloud_id'),
      numbers(co, 'l_deg'),
      numbers(co, 'b_deg'),
      await truthOf('CO'),
      5e-6,
    );
    // radius_arcsec is half the angular diameter: size_pc / dist.
    const truth = await truthOf('CO');
    const sizePc = numbers(truth, 'size_pc');
    const dist = numbers(truth, 'dist_kpc');
    numbers(co, 'radius_arcsec').forEach((r, i) => {
      const expected = (sizePc[i] / 2 / (dist[i] * 1000)) * (180 / Math.PI) * 3600; // small-angle
      expect(Math.abs(r - expected)).toBeLessThanOrEqual(0.05 + 1e-9);
    });
  });

  it('HII CSV: sexagesimal J2000 and heliocentric optical velocities round-trip to the truth', async () => {
    const hii = await readDelimited(join(dir, 'hrg-hii-regions.csv'), ',');
    expect(hii.header).toEqual([
      'REGION',
      'RA_J2000',
      'DEC_J2000',
      'V_HEL_OPT',
      'E_V_HEL',
      'RRL_FWHM',
      'DIAM_ARCMIN',
    ]);
    const ra = column(hii, 'RA_J2000');
    const dec = column(hii, 'DEC_J2000');
    expect(ra[0]).toMatch(/^\d\d:\d\d:\d\d\.\d\d$/);
    expect(dec[0]).toMatch(/^[+-]\d\d:\d\d:\d\d\.\d$/);
    const gal = ra.map((r, i) => equatorialToGalactic(parseRaDeg(r), parseDecDeg(dec[i])));
    const truth = await truthOf('HII');
    // RA to 0.01 s (0.15″), Dec to 0.1″: rounding ≤ 0.1″ ≈ 5e-7 rad, times ≤ 30 kpc, with margin.
    checkPositions(
      'HII',
      column(hii, 'REGION'),
      gal.map((g) => g.lDeg),
      gal.map((g) => g.bDeg),
      truth,
      4e-5,
    );
    const cat = galaxy.catalogs.HII;
    const vHel = numbers(hii, 'V_HEL_OPT');
    const vTrue = numbers(truth, 'v_lsr_true_kms');
    for (let i = 0; i < cat.count; i++) {
      const vLsrRadio = convertVelocityConvention(
        helioToLsrKms(vHel[i], gal[i].lDeg, gal[i].bDeg),
        'optical',
        'radio',
      );
      // 2 decimals written; the LSR correction moves < 1e-4 km/s for the position rounding.
      expect(Math.abs(vLsrRadio - cat.vLsrKms[i]), column(hii, 'REGION')[i]).toBeLessThan(0.006);
      // Observed = true + N(0, 1.5 km/s) measurement error: within 5σ (params: HII velErrKms).
      expect(Math.abs(vLsrRadio - vTrue[i])).toBeLessThan(5 * 1.5);
    }
    // The optical/radio difference is real: v_opt − v_radio = v_radio² / (c − v_radio) (exact
    // for radio v = c (1 − ν/ν₀) and optical v = c (ν₀/ν − 1); common practice), about 0.03 km/s
    // at 100 km/s.
    const fast = cat.vLsrKms.findIndex((v) => Math.abs(v) > 60);
    expect(fast).toBeGreaterThanOrEqual(0);
    const v = cat.vLsrKms[fast];
    expect(convertVelocityConvention(v, 'radio', 'optical') - v).toBeCloseTo(
      (v * v) / (299792.458 - v),
      9,
    );
  });

  it('OB VOTable: well-formed 1.4 with units and UCDs; degrees + true distance give the truth', async () => {
    const vot = await readVotable(join(dir, 'hrg-ob-associations.vot'));
    expect(vot.version).toBe('1.4');
    expect(vot.rows).toHaveLength(galaxy.catalogs.OB.count);
    const byName = Object.fromEntries(vot.fields.map((f) => [f.name, f]));
    expect(byName.ra).toMatchObject({ unit: 'deg', ucd: 'pos.eq.ra;meta.main' });
    expect(byName.dec).toMatchObject({ unit: 'deg', ucd: 'pos.eq.dec;meta.main' });
    expect(byName.vlsr).toMatchObject({ unit: 'km/s' });
    expect(byName.dist).toMatchObject({ unit: 'kpc', ucd: 'pos.distance' });
    expect(byName.dist_err).toMatchObject({ unit: 'kpc', ucd: 'stat.error;pos.distance' });
    const gal = votColumn(vot, 'ra').map((r, i) =>
      equatorialToGalactic(Number(r), Number(votColumn(vot, 'dec')[i])),
    );
    checkPositions(
      'OB',
      votColumn(vot, 'assoc'),
      gal.map((g) => g.lDeg),
      gal.map((g) => g.bDeg),
      await truthOf('OB'),
      5e-6,
    );
  });

  it('truth.json records every injected parameter and describes every file', async () => {
    const t = JSON.parse(await readFile(join(dir, 'truth.json'), 'utf8'));
    expect(t.seed).toBe(7);
    expect(t.arms).toHaveLength(2);
    expect(t.arms[0]).toHaveProperty('pitchDeg');
    expect(t.rotationCurve).toMatchObject({ name: 'table' });
    expect(t.rotationCurve.R0Kpc).toBe(DEFAULT_MODEL.curve.R0Kpc); // the generator's own R0
    expect(t.model.curve).toEqual(DEFAULT_MODEL.curve);
    expect(t.patternSpeedKmsKpc).toBe(DEFAULT_MODEL.patternSpeedKmsKpc);
    expect(t.corotationKpc).toBeGreaterThan(5);
    expect(t.conventions.streaming).toMatch(/exp\(−½ \(d⊥\/w\)²\)/);
    // The curve read back from the file is the one the sources were made with.
    const fromFile = galaxyCurve(t);
    for (const R of [3.1, 4.07, 8.2, 12.345, 17.9]) {
      expect(fromFile.thetaKms(R)).toBe(galaxyCurve(galaxy.truth).thetaKms(R));
    }
    expect(fromFile.theta0Kms).toBeCloseTo(DEFAULT_MODEL.curve.theta0Kms, 9);
    // The ordering truth survives the JSON round trip (numbers, nulls and bins).
    expect(t.ordering).toEqual(JSON.parse(JSON.stringify(galaxy.truth.ordering)));
    expect(t.ordering.youngMinusGasAzimuthDeg).toHaveLength(10);
    expect(t.model.phase).toHaveProperty('starFormationDelayMyr');
    expect(t.model.tracers.CO).toHaveProperty('intraShiftPc');
    expect(t.counts.complexes).toBe(400);
    expect(t.counts.interlopers).toBe(200);
    expect(Object.keys(t.files.catalogs)).toEqual(['HI', 'CO', 'HII', 'OB']);
    expect(t.files.catalogs.HII.columns.map((c: { name: string }) => c.name)).toContain(
      'V_HEL_OPT',
    );
  });
});
