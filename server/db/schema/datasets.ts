// Datasets and their immutable versions (owned by the data-intake work).
export {};
