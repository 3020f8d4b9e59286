import { EmptyState, PageHeader } from '@/components/ui/panel';

export default function ComplexesPage() {
  return (
    <>
      <PageHeader title="Complexes" lead="Groups of linked tracers — gas and young stars that belong together." />
      <EmptyState title="No complexes yet">
        Complexes come from link runs. Start a link run from two or more ready catalogs; its complexes are listed here
        for review when it finishes.
      </EmptyState>
    </>
  );
}
