import { Cautions } from '@/components/Cautions';
import { EmptyState } from '@/components/EmptyState';
import { PageHeader } from '@/components/PageHeader';

/** Models are not built yet: say what will live here, with the cautions that will sit beside results. */
export function ModelsEmptyPage() {
  return (
    <>
      <PageHeader title="Models" description="A model is a named question: which predictors matter for an outcome in one dataset." />
      <div className="space-y-6">
        <EmptyState title="Model building is coming to Lariat">
          <p>
            This page will list your models. Each model names a dataset, the outcome, and the family (a number or a
            yes/no), and holds its fits: version 1, 2 and so on, each with its full settings, the dataset version and
            the seed, so any fit can be repeated exactly.
          </p>
          <p>
            Fits will run lasso, elastic-net, group-lasso and logistic paths, with cross-validation choosing the
            penalty. Nothing can be created here yet.
          </p>
        </EmptyState>
        <Cautions />
      </div>
    </>
  );
}
