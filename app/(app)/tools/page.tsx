import { ConvertCalculator } from '@/components/forms/calculator-convert';
import { DistanceCalculator } from '@/components/forms/calculator-distance';
import { PageHeader, Panel } from '@/components/ui/panel';
import { TOOL_CURVE_PRESETS } from '@/lib/calculators';

export const metadata = { title: 'Calculators' };

export default function CalculatorsPage() {
  return (
    <main className="mx-auto w-full max-w-6xl space-y-6 px-6 py-8">
      <PageHeader
        title="Calculators"
        lead="Quick conversions for lists you paste: sky positions between J2000 / ICRS and Galactic coordinates, and kinematic distances for circular Galactic rotation. The same calculations are available to scripts at POST /api/tools/convert and POST /api/tools/kinematic-distance."
      />
      <Panel title="Coordinate conversion">
        <ConvertCalculator />
      </Panel>
      <Panel title="Kinematic distances">
        <p className="mb-3 max-w-4xl text-xs text-ink-soft">
          v_LSR = R0 sin l cos b (Θ(R)/R − Θ0/R0), solved for the Galactocentric radius R and then
          for the line-of-sight distances d = (R0 cos l ± √(R² − R0² sin² l)) / cos b. The frame is
          that of Reid et al. (2014): the Sun on the positive x axis at R0, azimuth 0 toward the
          Sun, increasing with Galactic longitude. Inside the solar circle a velocity has a near and
          a far root; outside it one, shown under single. Each root comes with a 68 % interval from
          Monte Carlo draws over the velocity (its σ_v, or 7 km/s of streaming) and over the
          curve&apos;s published uncertainties of R0 and Θ0 (methods: docs/methods.md,
          &quot;Kinematic distances&quot;).
        </p>
        <DistanceCalculator presets={TOOL_CURVE_PRESETS} />
      </Panel>
    </main>
  );
}
