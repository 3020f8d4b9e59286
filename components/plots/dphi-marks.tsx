/**
 * The marks of a Δφ(R) figure, shared by the Milky-Way and external-galaxy views: the zero line,
 * corotation (dashed), the fitted model curve, and per ring its Δφ with the 95 % interval,
 * filled when the pattern fit used the ring and hollow when it left it out.
 */
import { PLOT_COLOURS } from '@/components/plots/figure';

/** One ring as drawn: radius (kpc), Δφ (deg) and its interval. */
export type DphiRingMark = {
  key: number;
  RKpc: number;
  dphiDeg: number;
  ci95: [number, number] | null;
  fitted: boolean;
};

export function DphiMarks({
  px,
  py,
  xSpan,
  corotationKpc,
  model,
  rings,
}: {
  px: (x: number) => number;
  py: (y: number) => number;
  xSpan: [number, number];
  corotationKpc: number | null;
  model: ReadonlyArray<readonly [number, number]>;
  rings: DphiRingMark[];
}) {
  return (
    <>
      <line
        x1={px(xSpan[0]) - 1e4}
        x2={px(xSpan[1]) + 1e4}
        y1={py(0)}
        y2={py(0)}
        stroke={PLOT_COLOURS.rule}
      />
      {corotationKpc !== null && (
        <line
          x1={px(corotationKpc)}
          x2={px(corotationKpc)}
          y1={-1e4}
          y2={1e4}
          stroke={PLOT_COLOURS.inkSoft}
          strokeDasharray="6 4"
          data-testid="dphi-corotation"
        />
      )}
      {model.length > 1 && (
        <polyline
          points={model.map(([x, y]) => `${px(x).toFixed(1)},${py(y).toFixed(1)}`).join(' ')}
          fill="none"
          stroke={PLOT_COLOURS.accent}
          strokeWidth={1.8}
          data-testid="dphi-model-line"
        />
      )}
      {rings.map((r) => (
        <g key={r.key} data-testid="dphi-ring">
          {r.ci95 && (
            <line
              x1={px(r.RKpc)}
              x2={px(r.RKpc)}
              y1={py(r.ci95[0])}
              y2={py(r.ci95[1])}
              stroke={PLOT_COLOURS.ink}
              strokeWidth={1.2}
              data-testid="dphi-interval"
            />
          )}
          <circle
            cx={px(r.RKpc)}
            cy={py(r.dphiDeg)}
            r={4}
            fill={r.fitted ? PLOT_COLOURS.ink : PLOT_COLOURS.background}
            stroke={PLOT_COLOURS.ink}
            strokeWidth={1.3}
          />
        </g>
      ))}
    </>
  );
}
