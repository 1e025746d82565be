import type { DesignMatrix, EngineTable, FitSpec, PathOptions, PathResult } from '../types';

/** Not yet implemented (signature stable). */
export function fitPathOnDesign(design: DesignMatrix, y: Float64Array, options: PathOptions): PathResult {
  void design;
  void y;
  void options;
  throw new Error('fitPathOnDesign: not implemented yet');
}

/** Not yet implemented (signature stable). */
export function fitPath(table: EngineTable, spec: FitSpec): PathResult {
  void table;
  void spec;
  throw new Error('fitPath: not implemented yet');
}
