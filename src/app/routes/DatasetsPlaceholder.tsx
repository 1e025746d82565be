import { EmptyState } from '@/components/EmptyState';
import { PageHeader } from '@/components/PageHeader';

/** Stands in until the datasets feature registers its own routes (see ../feature-routes.tsx). */
export function DatasetsPlaceholder() {
  return (
    <>
      <PageHeader title="Datasets" description="The tables your models learn from. Every upload is kept as an immutable version." />
      <EmptyState title="Uploading data is coming to Lariat">
        <p>This page will list your datasets and their versions, each with its checksum, columns and row count.</p>
      </EmptyState>
    </>
  );
}
