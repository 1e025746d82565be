import { createSortedRowModel, rowSortingFeature, sortFn_alphanumeric, sortFn_basic, sortFn_text, tableFeatures } from '@tanstack/react-table';

/**
 * The one feature set Lariat's tables use: client-side sorting. Filtering is done on the data before
 * it reaches the table (plain array filters are simpler to read and to test than filter state).
 */
export const sortableFeatures = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, basic: sortFn_basic },
});

export type SortableFeatures = typeof sortableFeatures;
