import { EmptyState, PageHeader } from '@/components/ui/panel';

export default function ArmsPage() {
  return (
    <>
      <PageHeader title="Arms & ordering" lead="Kinematic distances, spiral-arm models and the offsets of gas and young stars across the arms." />
      <EmptyState title="No ordering analysis yet">
        An ordering analysis needs a finished link run. Meanwhile the Calculators page gives kinematic distances for any
        list of positions and velocities.
      </EmptyState>
    </>
  );
}
