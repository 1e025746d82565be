import type { EngineTable, FitSpec } from '../types';

/** Throws EngineInputError naming the field at fault. Not yet implemented (signature stable). */
export function validateSpec(table: EngineTable, spec: FitSpec): void {
  void table;
  void spec;
}
