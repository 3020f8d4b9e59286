import { describe, expect, it } from 'vitest';
import { armRadiusKpc } from '@/lib/astro/arms';
import { fromGalactocentric, polarToXy } from '@/lib/astro/galactocentric';
import { kinematicDistance } from '@/lib/astro/kinematic-distance';
import { runOrderingAnalysis, type OrderingComplex } from '@/lib/ordering';
import { decomposeVector, orbitDisplacementKpc } from '@/lib/ordering/gas-to-stars';
import { FLAT, handSettings, memberAt, memberSeen, TEST_ARM } from './hand-made';

const DEG = Math.PI / 180;
const R0 = FLAT.R0Kpc;

/** Unit vectors at azimuth β in the frame of lib/astro/galactocentric: radial ê_R and ahead ê_β. */
function axes(betaDeg: number) {
  const b = betaDeg * DEG;
  return { rx: Math.cos(b), ry: -Math.sin(b), ax: -Math.sin(b), ay: -Math.cos(b) };
}

/** Ridge point of TEST_ARM at azimuth β. */
function ridge(betaDeg: number) {
  const R = armRadiusKpc(TEST_ARM, betaDeg);
  return { R, ...polarToXy(R, betaDeg) };
}

function overrideAt(xKpc: number, yKpc: number) {
  return { distKpc: fromGalactocentric(xKpc, yKpc, 0, R0).distKpc };
}

describe('placement against the arm', () => {
  it('a complex exactly on the ridge has zero perpendicular and azimuthal offset', () => {
    const p = ridge(30);
    const cx: OrderingComplex = {
      id: 'on-ridge',
      members: [memberAt('co', p.xKpc, p.yKpc), memberAt('hii', p.xKpc, p.yKpc)],
      distanceOverride: overrideAt(p.xKpc, p.yKpc),
    };
    const row = runOrderingAnalysis([cx], handSettings()).complexes[0];
    expect(row.perpOffsetKpc).toBeCloseTo(0, 6); // geometric identity: the point lies on the ridge
    expect(row.azimuthOffsetDeg).toBeCloseTo(0, 6); // geometric identity
    expect(row.RKpc).toBeCloseTo(p.R, 9); // lib/astro/galactocentric round trip
    expect(row.arm).toBe('Saltmarsh Arm');
    expect(row.used).toBe(true);
    expect(row.intraAcrossKpc).toBeCloseTo(0, 9); // gas and stars coincide
  });

  it('a complex 0.2 kpc ahead along the ridge normal has perpOffset +0.2 kpc', () => {
    const p = ridge(30);
    const a = axes(30);
    const psi = TEST_ARM.pitchDeg * DEG;
    // Normal of a trailing log spiral pointing ahead: cos ψ ê_R + sin ψ ê_β (Reid et al. 2014 form, by differentiation)
    const nx = Math.cos(psi) * a.rx + Math.sin(psi) * a.ax;
    const ny = Math.cos(psi) * a.ry + Math.sin(psi) * a.ay;
    const x = p.xKpc + 0.2 * nx;
    const y = p.yKpc + 0.2 * ny;
    const cx: OrderingComplex = {
      id: 'ahead',
      members: [memberAt('co', x, y)],
      distanceOverride: overrideAt(x, y),
    };
    const row = runOrderingAnalysis([cx], handSettings()).complexes[0];
    expect(row.perpOffsetKpc).toBeCloseTo(0.2, 4); // by construction (curvature effect < 1e-4 kpc)
    expect(row.azimuthOffsetDeg!).toBeGreaterThan(0); // ahead in rotation (lib/astro/arms sign convention)
  });
});

describe('gas→stars decomposition', () => {
  it('splits a vector along ê_β into ψ-rotated across and along parts', () => {
    const beta = 40;
    const psi = 12 * DEG;
    const a = axes(beta);
    const nx = Math.cos(psi) * a.rx + Math.sin(psi) * a.ax;
    const ny = Math.cos(psi) * a.ry + Math.sin(psi) * a.ay;
    const along = decomposeVector(0.01 * a.ax, 0.01 * a.ay, nx, ny, beta);
    expect(along.acrossKpc).toBeCloseTo(0.01 * Math.sin(psi), 12); // log-spiral geometry: ê_β·n̂ = sin ψ
    expect(along.alongKpc).toBeCloseTo(0.01 * Math.cos(psi), 12); // ê_β·t̂ = cos ψ
    const across = decomposeVector(-0.005 * nx, -0.005 * ny, nx, ny, beta);
    expect(across.acrossKpc).toBeCloseTo(-0.005, 12); // pure normal vector
    expect(across.alongKpc).toBeCloseTo(0, 12);
  });

  it('deprojects the seen part of a displacement along the orbit back to its full length', () => {
    const p = ridge(20);
    const a = axes(20);
    const S = 0.012;
    const ux = p.xKpc - R0;
    const uy = p.yKpc;
    const u = Math.hypot(ux, uy);
    const along = (S * a.ax * ux + S * a.ay * uy) / u;
    // What the Sun sees: the displacement minus its line-of-sight part.
    const seenX = S * a.ax - (along * ux) / u;
    const seenY = S * a.ay - (along * uy) / u;
    expect(orbitDisplacementKpc(seenX, seenY, p.xKpc, p.yKpc, R0)).toBeCloseTo(S, 12); // exact inverse of the projection
    expect(orbitDisplacementKpc(0.01, 0, R0 + 0.001, 3, R0)).toBeNaN(); // orbit along the sight line (l ≈ 90°)
  });

  it('recovers a 10 pc displacement of young stars ahead along the orbit from sky positions', () => {
    const p = ridge(25);
    const a = axes(25);
    const S = 0.01;
    const star = { x: p.xKpc + S * a.ax, y: p.yKpc + S * a.ay };
    const cx: OrderingComplex = {
      id: 'shifted',
      members: [
        memberAt('co', p.xKpc, p.yKpc),
        memberAt('hi', p.xKpc, p.yKpc),
        memberAt('ob', star.x, star.y),
      ],
      distanceOverride: overrideAt(p.xKpc, p.yKpc),
    };
    const r = runOrderingAnalysis([cx], handSettings());
    const expected = S * Math.sin(12 * DEG); // across part of S ê_β for pitch 12° (log-spiral geometry)
    expect(r.complexes[0].intraAcrossKpc!).toBeCloseTo(expected, 5); // first order in S/d
    expect(r.intraComplex.n).toBe(1);
    expect(r.intraComplex.medianAlongKpc!).toBeCloseTo(S * Math.cos(12 * DEG), 4); // along part, cos ψ (to ~0.1 %: S/d and the normal taken at the complex centre)
  });
});

describe('distances and their choice', () => {
  it('a hand-set distance wins over the kinematic one', () => {
    const cx: OrderingComplex = {
      id: 'hand',
      members: [memberSeen('co', 30, 0, 60), memberSeen('ob', 30, 0, 60, 2.0, 0.1)],
      distanceOverride: { distKpc: 4.321, note: 'maser parallax' },
    };
    const row = runOrderingAnalysis([cx], handSettings()).complexes[0];
    expect(row.choice).toBe('override');
    expect(row.distKpc).toBe(4.321); // the override itself
    expect(row.distLoKpc).toBe(4.321); // every draw is the override: no spread
    expect(row.reason).toContain('maser parallax');
  });

  it('an independent distance picks the near or far root and keeps the kinematic distance', () => {
    const kd = kinematicDistance(30, 0, 60, FLAT); // two roots inside the solar circle
    const near = kd.nearKpc!;
    const far = kd.farKpc!;
    const mk = (id: string, d: number): OrderingComplex => ({
      id,
      members: [memberSeen('co', 30, 0, 60), memberSeen('ob', 30, 0, 60, d, 0.3)],
    });
    const r = runOrderingAnalysis(
      [mk('n', near + 0.2), mk('f', far - 0.3)],
      handSettings({ armWidthKpc: 50, mcDraws: 2000 }),
    );
    expect(r.complexes[0].choice).toBe('near');
    expect(r.complexes[0].pNear!).toBeGreaterThan(0.99); // likelihood ratio of N(d_ind; d, 0.3²) at the two roots
    // the median of the draws is the root of the median velocity (a monotonic map), to sampling error
    expect(r.complexes[0].distKpc!).toBeCloseTo(near, 1);
    expect(r.complexes[1].choice).toBe('far');
    expect(r.complexes[1].pNear!).toBeLessThan(0.01);
    expect(r.complexes[1].distKpc!).toBeCloseTo(far, 1);
    expect(r.complexes[0].distLoKpc!).toBeLessThan(r.complexes[0].distHiKpc!);
  });

  it('uses an independent distance as the distance where the kinematic one is unreliable', () => {
    const cx: OrderingComplex = {
      id: 'gc',
      members: [memberSeen('co', 5, 0, 20), memberSeen('ob', 5, 0, 20, 3.1, 0.2)],
    };
    const row = runOrderingAnalysis([cx], handSettings({ armWidthKpc: 50, mcDraws: 2000 }))
      .complexes[0];
    expect(row.choice).toBe('independent');
    expect(row.distKpc!).toBeCloseTo(3.1, 1); // the member's own distance, drawn with its 0.2 kpc error
    expect(row.distHiKpc! - row.distLoKpc!).toBeCloseTo(0.4, 1); // 68 % interval of N(3.1, 0.2²)
    expect(row.excludedBecause).toBeNull();
  });

  it('latitude decides near when the far root would lie far out of the plane', () => {
    const cx: OrderingComplex = { id: 'high', members: [memberSeen('co', 30, 1.5, 60)] };
    // far root ≈ 10.4 kpc → |z| ≈ 0.27 kpc > 2.5 × 0.06 kpc: the latitude rule (common practice)
    const latitude = runOrderingAnalysis(
      [cx],
      handSettings({ armWidthKpc: 50, nearFar: 'latitude' }),
    );
    expect(latitude.complexes[0].choice).toBe('near');
    expect(latitude.complexes[0].pNear).toBe(1);
    // and the probabilistic rule: w ∝ d² exp(−z²/2h²) puts all but a vanishing weight on near
    const probable = runOrderingAnalysis([cx], handSettings({ armWidthKpc: 50 }));
    expect(probable.complexes[0].pNear!).toBeGreaterThan(0.99);
  });

  it('falls back to all members for the velocity when no gas member has one, and says so', () => {
    const cx: OrderingComplex = {
      id: 'nogasv',
      members: [memberSeen('co', 130, 0, NaN), memberSeen('hii', 130, 0, -40)],
    };
    const r = runOrderingAnalysis([cx], handSettings({ armWidthKpc: 50 }));
    expect(r.complexes[0].choice).toBe('single'); // outer Galaxy: one root
    expect(r.complexes[0].vLsrKms).toBe(-40);
    expect(r.warnings.join(' ')).toMatch(/1 of 1 complex have no gas member with a velocity/);
  });
});

describe('exclusions', () => {
  it('counts every reason and keeps the excluded complexes listed', () => {
    const p = ridge(30);
    const farOff = polarToXy(p.R + 3, 30);
    const complexes: OrderingComplex[] = [
      { id: 'gc-window', members: [memberSeen('co', 8, 0, 30)] },
      { id: 'no-v', members: [memberSeen('co', 40, 0, NaN)] },
      // flat curve at l = 30°: terminal velocity Θ0 (1 − sin l) = 110 km/s (flat-curve closed form, exact)
      { id: 'beyond', members: [memberSeen('co', 30, 0, 130)] },
      // 2 km/s below it: the roots lie closer than σ_v = √(1² + 7²) km/s can separate
      // (half-separation × |dv/dd| = 2 (v_t − v) for a parabolic peak; exact geometry)
      { id: 'tangent-ish', members: [memberSeen('co', 30, 0, 108)] },
      // second quadrant, positive velocity: forbidden for circular rotation
      { id: 'forbidden', members: [memberSeen('co', 120, 0, 50)] },
      { id: 'ambiguous', members: [memberSeen('co', 30, 0, 60)] },
      {
        id: 'off-arm',
        members: [memberAt('co', farOff.xKpc, farOff.yKpc)],
        distanceOverride: overrideAt(farOff.xKpc, farOff.yKpc),
      },
      {
        id: 'good',
        members: [memberAt('co', p.xKpc, p.yKpc)],
        distanceOverride: overrideAt(p.xKpc, p.yKpc),
      },
    ];
    const r = runOrderingAnalysis(complexes, handSettings({ nearFar: 'latitude' }));
    expect(r.exclusions).toEqual({
      complexes: 8,
      used: 1,
      reasons: {
        'no-velocity': 1,
        'unreliable-longitude': 1,
        'beyond-terminal': 1,
        'near-tangent': 1,
        'no-distance': 1,
        'unresolved-near-far': 1,
        'off-arm': 1,
      },
    }); // one complex built for each reason
    expect(r.complexes.map((c) => c.excludedBecause)).toEqual([
      'unreliable-longitude',
      'no-velocity',
      'beyond-terminal',
      'near-tangent',
      'no-distance',
      'unresolved-near-far',
      'off-arm',
      null,
    ]);
    expect(r.complexes[2].choice).toBe('tangent');
    expect(r.complexes[2].flags).toContain('beyond-terminal');
    expect(r.warnings).toContain(
      '1 of 8 complexes left out: kinematic distance within 15° of l = 0° or 180°, where it is unreliable.',
    );
    expect(r.warnings.filter((w) => w.includes('left out:'))).toHaveLength(7);
  });

  it('rejects bad input naming the value and where it is', () => {
    const ok = { id: 'a', members: [memberSeen('co', 30, 0, 60)] };
    expect(() =>
      runOrderingAnalysis([{ id: 'bad', members: [memberSeen('co', 30, 95, 60)] }], handSettings()),
    ).toThrow(/complex "bad" \(#1\), member 1: bDeg = 95/);
    expect(() => runOrderingAnalysis([ok, { id: 'empty', members: [] }], handSettings())).toThrow(
      /"empty" \(#2\) has no members/,
    );
    expect(() => runOrderingAnalysis([ok], handSettings({ resamples: 100 }))).toThrow(
      /settings.resamples = 100/,
    );
    expect(() =>
      runOrderingAnalysis([{ ...ok, distanceOverride: { distKpc: -1 } }], handSettings()),
    ).toThrow(/distanceOverride.distKpc = -1/);
  });

  it('reports progress from 0 to 1 in order', () => {
    const seen: number[] = [];
    runOrderingAnalysis(
      [{ id: 'a', members: [memberSeen('co', 30, 0, 60)] }],
      handSettings(),
      (f) => seen.push(f),
    );
    expect(seen[seen.length - 1]).toBe(1);
    expect(seen.every((f, i) => i === 0 || f >= seen[i - 1])).toBe(true);
  });
});

describe('measurements do not depend on the model they test', () => {
  /** Complexes on both sides of TEST_ARM's ridge, gas behind and young stars ahead. */
  function twoSided(): OrderingComplex[] {
    const out: OrderingComplex[] = [];
    const psi = TEST_ARM.pitchDeg * DEG;
    for (let k = 0; k < 40; k++) {
      const beta = 10 + 2 * k;
      const p = ridge(beta);
      const a = axes(beta);
      const nx = Math.cos(psi) * a.rx + Math.sin(psi) * a.ax;
      const ny = Math.cos(psi) * a.ry + Math.sin(psi) * a.ay;
      const shift = k % 2 === 0 ? -0.15 : 0.15;
      const x = p.xKpc + shift * nx;
      const y = p.yKpc + shift * ny;
      out.push({
        id: `c${k}`,
        members: [memberAt(k % 2 === 0 ? 'co' : 'hii', x, y)],
        distanceOverride: overrideAt(x, y),
      });
    }
    return out;
  }

  it('class offsets are measured in the sense of rotation, whatever pattern speed is stated', () => {
    const a = runOrderingAnalysis(twoSided(), handSettings({ patternSpeedKmsKpc: 15 }));
    const b = runOrderingAnalysis(twoSided(), handSettings({ patternSpeedKmsKpc: 30 }));
    const none = runOrderingAnalysis(twoSided(), handSettings());
    expect(a.classes).toEqual(b.classes); // the measurement ignores the assumption
    expect(a.youngMinusGas).toEqual(none.youngMinusGas);
    const co = a.classes.find((c) => c.kind === 'co')!;
    const hii = a.classes.find((c) => c.kind === 'hii')!;
    expect(co.medianOffsetKpc!).toBeCloseTo(-0.15, 3); // placed 150 pc behind the ridge by construction
    expect(hii.medianOffsetKpc!).toBeCloseTo(0.15, 3); // and 150 pc ahead
    expect(a.youngMinusGas.medianOffsetKpc!).toBeCloseTo(0.3, 3);
    // only the interpretation uses it, and says it is assumed
    expect(a.interpretation).toMatchObject({ source: 'assumed', patternSpeedKmsKpc: 15 });
    expect(none.interpretation.source).toBeNull();
    expect(a.headline.join(' ')).toMatch(/assumed \(not fitted\) pattern speed/);
  });

  it('carries the curve constants into the distance intervals', { timeout: 60_000 }, () => {
    const cx: OrderingComplex[] = [{ id: 'a', members: [memberSeen('co', 40, 0, -30)] }];
    const without = runOrderingAnalysis(cx, handSettings({ armWidthKpc: 50, mcDraws: 1000 }));
    const withErr = runOrderingAnalysis(
      cx,
      handSettings({ armWidthKpc: 50, mcDraws: 1000, R0ErrKpc: 0.4, theta0ErrKms: 15 }),
    );
    const width = (r: typeof without) => r.complexes[0].distHiKpc! - r.complexes[0].distLoKpc!;
    expect(width(withErr)).toBeGreaterThan(1.2 * width(without)); // R0 and Θ0 errors add spread
    expect(without.warnings.join(' ')).toMatch(/carry no uncertainty/);
  });

  it('states the link radius in pc beside the intra-complex offset', () => {
    const p = ridge(30);
    const cx: OrderingComplex = {
      id: 'pair',
      members: [memberAt('co', p.xKpc, p.yKpc), memberAt('hii', p.xKpc + 0.001, p.yKpc)],
      distanceOverride: overrideAt(p.xKpc, p.yKpc),
    };
    const r = runOrderingAnalysis([cx], handSettings({ linkRadiusArcsec: [60, 60] }));
    const d = overrideAt(p.xKpc, p.yKpc).distKpc;
    const pc = 60 * (Math.PI / 180 / 3600) * d * 1000; // small-angle arc length (exact geometry)
    expect(r.intraComplex.linkRadiusPc![0]).toBeCloseTo(pc, 9);
    expect(r.headline.join(' ')).not.toMatch(/own parent|within complexes/i); // not in the headline
  });
});
