import { EmptyState } from '@/components/EmptyState';
import { PageHeader } from '@/components/PageHeader';

export function ReviewsEmptyPage() {
  return (
    <>
      <PageHeader title="Reviews" description="Where reviewers read fits, leave comments and decide." />
      <EmptyState title="Reviews are coming to Lariat">
        <p>
          When analysts ask for a review of a fit, the request will appear here. Reviewers will compare its path and
          earlier versions, comment, and either approve it or send it back with their notes.
        </p>
        <p>Nothing can be reviewed yet, because fits cannot be created yet.</p>
      </EmptyState>
    </>
  );
}
