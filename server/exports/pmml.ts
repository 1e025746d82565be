/**
 * PMML 4.4 (Data Mining Group, https://dmg.org/pmml/v4-4-1/Regression.html) of a fit at one lambda:
 * a RegressionModel whose coefficients are on the original scale, so the standardization is already
 * folded in (standardized x = (x - center) / scale was undone when the coefficients were stored), and
 * whose categorical predictors carry one coefficient per level seen when fitting (Lariat keeps an
 * indicator for every level; no reference level). Missing values are replaced as the fit did when it
 * was run with `missing: impute` (missingValueReplacement); otherwise a missing value is left to the
 * scoring engine. Gaussian: functionName="regression", the predicted value is b0 + x'b. Binomial:
 * functionName="classification" with normalizationMethod="logit": the first table (the class counted
 * as 1) gives p = 1 / (1 + exp(-(b0 + x'b))), the second (intercept 0) takes the rest.
 * One difference: PMML gives an unseen category a coefficient of 0, where Lariat refuses the row.
 */
import { CAUTION_LINES } from '../../shared/cautions';
import type { ChosenModel } from './chosen-model';

export const PMML_NAMESPACE = 'http://www.dmg.org/PMML-4_4';

function esc(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&apos;');
}

/** Shortest text that reads back as the same double. */
const num = (v: number) => String(v);

export function fitToPmml(m: ChosenModel, modelName: string, exportedAt = new Date()): string {
  const { fit, results } = m;
  const spec = fit.spec;
  const binomial = spec.family === 'binomial';
  const enc = results.encoding;
  const [negative, positive] = enc.responseLevels ?? ['0', '1'];
  const out: string[] = [];
  out.push('<?xml version="1.0" encoding="UTF-8"?>');
  out.push(`<PMML xmlns="${PMML_NAMESPACE}" version="4.4">`);
  out.push(`  <Header description="${esc(`${modelName}, version ${fit.version}, at lambda ${num(m.lambda)} (${m.rule})`)}">`);
  out.push(`    <Application name="Lariat" version="${esc(fit.engineVersion)}"/>`);
  out.push(`    <Annotation>${esc(`Fit ${fit.id}; dataset SHA-256 ${fit.datasetSha256}; coefficients on the original scale (standardization folded in).`)}</Annotation>`);
  out.push('    <Annotation>A category not seen when fitting adds 0 here; Lariat itself refuses such a row.</Annotation>');
  for (const line of CAUTION_LINES) out.push(`    <Annotation>${esc(line)}</Annotation>`);
  out.push(`    <Timestamp>${exportedAt.toISOString()}</Timestamp>`);
  out.push('  </Header>');

  const fields = enc.columns.length + 1;
  out.push(`  <DataDictionary numberOfFields="${fields}">`);
  if (binomial) {
    out.push(`    <DataField name="${esc(spec.outcome)}" optype="categorical" dataType="string">`);
    out.push(`      <Value value="${esc(negative)}"/>`);
    out.push(`      <Value value="${esc(positive)}"/>`);
    out.push('    </DataField>');
  } else {
    out.push(`    <DataField name="${esc(spec.outcome)}" optype="continuous" dataType="double"/>`);
  }
  for (const c of enc.columns) {
    if (c.kind === 'numeric') {
      out.push(`    <DataField name="${esc(c.column)}" optype="continuous" dataType="double"/>`);
    } else {
      out.push(`    <DataField name="${esc(c.column)}" optype="categorical" dataType="string">`);
      for (const level of c.levels) out.push(`      <Value value="${esc(level)}"/>`);
      out.push('    </DataField>');
    }
  }
  out.push('  </DataDictionary>');

  const kind = binomial ? 'functionName="classification" normalizationMethod="logit"' : 'functionName="regression" normalizationMethod="none"';
  out.push(`  <RegressionModel modelName="${esc(modelName)}" ${kind} algorithmName="${esc(spec.penalty)}">`);
  out.push('    <MiningSchema>');
  out.push(`      <MiningField name="${esc(spec.outcome)}" usageType="target"/>`);
  for (const c of enc.columns) {
    const fill = c.kind === 'numeric' ? c.imputeValue : c.imputeLevel;
    const replacement = fill === undefined ? '' : ` missingValueReplacement="${esc(String(fill))}" missingValueTreatment="${c.kind === 'numeric' ? 'asMean' : 'asMode'}"`;
    out.push(`      <MiningField name="${esc(c.column)}" usageType="active"${replacement}/>`);
  }
  out.push('    </MiningSchema>');
  out.push('    <Output>');
  if (binomial) {
    out.push(`      <OutputField name="probability" optype="continuous" dataType="double" feature="probability" value="${esc(positive)}"/>`);
  } else {
    out.push('      <OutputField name="linear_predictor" optype="continuous" dataType="double" feature="predictedValue"/>');
  }
  out.push('    </Output>');
  const target = binomial ? ` targetCategory="${esc(positive)}"` : '';
  out.push(`    <RegressionTable intercept="${num(m.intercept)}"${target}>`);
  for (const c of enc.columns) {
    if (c.kind === 'numeric') {
      const b = m.coefficients[c.term];
      if (b !== 0) out.push(`      <NumericPredictor name="${esc(c.column)}" exponent="1" coefficient="${num(b)}"/>`);
    } else {
      c.levels.forEach((level, k) => {
        const b = m.coefficients[c.terms[k]];
        if (b !== 0) out.push(`      <CategoricalPredictor name="${esc(c.column)}" value="${esc(level)}" coefficient="${num(b)}"/>`);
      });
    }
  }
  out.push('    </RegressionTable>');
  if (binomial) out.push(`    <RegressionTable intercept="0" targetCategory="${esc(negative)}"/>`);
  out.push('  </RegressionModel>');
  out.push('</PMML>');
  return `${out.join('\n')}\n`;
}
