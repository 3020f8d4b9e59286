import { EmptyState, PageHeader } from '@/components/ui/panel';

export default function CatalogsPage() {
  return (
    <>
      <PageHeader title="Catalogs" lead="Tracer catalogs of this project, normalised to Galactic l, b and LSR velocity." />
      <EmptyState title="No catalogs yet">Upload a CSV, TSV or VOTable file of HI or CO clouds, HII regions or OB associations.</EmptyState>
    </>
  );
}
