/**
 * A small, independent PMML 4.4 RegressionModel evaluator for the round-trip test: it reads only the
 * XML (fast-xml-parser), never Lariat's code, and follows the standard's rules
 * (https://dmg.org/pmml/v4-4-1/Regression.html): y = intercept + sum(coefficient * x^exponent) +
 * coefficient of the matching category; normalizationMethod "logit" turns y into 1 / (1 + exp(-y)).
 * Missing values take the MiningField's missingValueReplacement when it has one, else the row is
 * unscorable (null).
 */
import { XMLParser } from 'fast-xml-parser';

type Attrs = Record<string, string>;
const list = <T>(v: T | T[] | undefined): T[] => (v === undefined ? [] : Array.isArray(v) ? v : [v]);

export interface PmmlModel {
  version: string;
  namespace: string;
  functionName: string;
  normalization: string;
  fields: Map<string, { optype: string; values: string[] }>;
  replacement: Map<string, string>;
  tables: { intercept: number; target: string | null; numeric: { name: string; exponent: number; coefficient: number }[]; categorical: { name: string; value: string; coefficient: number }[] }[];
  outputs: { name: string; feature: string; value: string | null }[];
}

export function parsePmml(xml: string): PmmlModel {
  const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', parseAttributeValue: false, parseTagValue: false });
  const root = parser.parse(xml) as { PMML: Record<string, unknown> };
  const pmml = root.PMML;
  const dict = pmml.DataDictionary as unknown as { DataField: (Attrs & { Value?: Attrs | Attrs[] }) | (Attrs & { Value?: Attrs | Attrs[] })[] };
  const model = pmml.RegressionModel as unknown as Attrs & { MiningSchema: { MiningField: Attrs | Attrs[] }; RegressionTable: unknown; Output?: { OutputField: Attrs | Attrs[] } };
  const fields = new Map(list(dict.DataField).map((f) => [f.name, { optype: f.optype, values: list(f.Value).map((v) => v.value) }]));
  const replacement = new Map(list(model.MiningSchema.MiningField).flatMap((m) => (m.missingValueReplacement !== undefined ? [[m.name, m.missingValueReplacement] as [string, string]] : [])));
  const tables = list(model.RegressionTable as (Attrs & { NumericPredictor?: Attrs | Attrs[]; CategoricalPredictor?: Attrs | Attrs[] })[]).map((t) => ({
    intercept: Number(t.intercept),
    target: t.targetCategory ?? null,
    numeric: list(t.NumericPredictor).map((p) => ({ name: p.name, exponent: Number(p.exponent ?? '1'), coefficient: Number(p.coefficient) })),
    categorical: list(t.CategoricalPredictor).map((p) => ({ name: p.name, value: p.value, coefficient: Number(p.coefficient) })),
  }));
  return {
    version: pmml.version as string,
    namespace: pmml.xmlns as string,
    functionName: model.functionName,
    normalization: model.normalizationMethod ?? 'none',
    fields,
    replacement,
    tables,
    outputs: list(model.Output?.OutputField).map((o) => ({ name: o.name, feature: o.feature, value: o.value ?? null })),
  };
}

/** Score of one row: the first table's value after normalization (regression: the prediction; logit: P(first table's category)). */
export function scorePmml(m: PmmlModel, row: Record<string, string | number | null | undefined>): number | null {
  const value = (name: string): string | null => {
    const v = row[name];
    if (v === null || v === undefined || v === '') return m.replacement.get(name) ?? null;
    return String(v);
  };
  const t = m.tables[0];
  let y = t.intercept;
  for (const p of t.numeric) {
    const v = value(p.name);
    if (v === null) return null;
    y += p.coefficient * Number(v) ** p.exponent;
  }
  for (const p of t.categorical) {
    const v = value(p.name);
    if (v === null) return null;
    if (v === p.value) y += p.coefficient;
  }
  if (m.normalization === 'logit') return 1 / (1 + Math.exp(-y));
  if (m.normalization !== 'none') throw new Error(`normalization ${m.normalization} not handled`);
  return y;
}
