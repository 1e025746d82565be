// The datasets area's public entry points for other areas (fits, seed, CLI).
export { loadEngineTable } from './load-engine-table';
export { importDatasetFromFile } from './service/import-file';
export { registerDatasetDependents, type DependentsHook } from './service/dependents';
export { datasetsApi } from './routes/index';
