/**
 * The full-data path as fitPath computes it (validate, encode, fit, attach notes and encoding), but
 * keeping the encoded design so cross-validation need not encode the table a second time.
 * tests/engine/cli/cli.test.ts checks the result equals fitPath's.
 */
import { buildDesign, fitPathOnDesign, validateSpec, type BuiltDesign } from '../engine/index';
import { pathOptionsFromSpec } from '../engine/path/fromSpec';
import type { EngineTable, FitSpec, PathResult } from '../engine/types';

export function fitWithDesign(table: EngineTable, spec: FitSpec): { path: PathResult; built: BuiltDesign } {
  validateSpec(table, spec);
  const built = buildDesign(table, spec);
  const path = fitPathOnDesign(built.design, built.y, pathOptionsFromSpec(spec, built));
  path.notes.unshift(...built.notes);
  path.encoding = built.encoding;
  return { path, built };
}
