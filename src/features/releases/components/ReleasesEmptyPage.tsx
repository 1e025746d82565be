import { EmptyState } from '@/components/EmptyState';
import { PageHeader } from '@/components/PageHeader';

export function ReleasesEmptyPage() {
  return (
    <>
      <PageHeader title="Releases" description="The fit that dashboards, scoring services and other teams receive for each model." />
      <EmptyState title="Releases are coming to Lariat">
        <p>
          Once a fit is approved, an analyst can release it. This page will show the released fit of every model, when
          it was released and by whom, and how consumers fetch its coefficients and scores through the API.
        </p>
        <p>There is nothing to release yet.</p>
      </EmptyState>
    </>
  );
}
