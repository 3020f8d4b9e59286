import { EmptyState, PageHeader } from '@/components/ui/panel';

export default function LinkRunsPage() {
  return (
    <>
      <PageHeader title="Link runs" lead="Cross-match catalogs by sky position and line-of-sight velocity." />
      <EmptyState title="No link runs yet">
        Upload at least two catalogs first; a link run then links their tracers within the match radius and velocity
        window you choose.
      </EmptyState>
    </>
  );
}
