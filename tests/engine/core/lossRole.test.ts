/**
 * Every loss role (family and form, server/engine/core/loss) answers consistently: the bound
 * gradient is the derivative of the bound value (central differences), the full evaluation's
 * X'theta is minus that gradient, and the Gram and design forms of the gaussian loss agree.
 */
import { describe, expect, it } from 'vitest';
import { lossFor } from '../../../server/engine/core/loss';
import { makeWorkingSet } from '../../../server/engine/core/problem';
import { prepareProblem } from '../../../server/engine/path/setup';
import { createRng } from '../../../server/engine/random';
import type { Family } from '../../../server/engine/types';
import { expectClose } from '../../support/numbers';

const n = 80;
const p = 5;
const rng = createRng(5);
const x = Float64Array.from({ length: n * p }, () => rng.normal());
const yOf = (family: Family) => Float64Array.from({ length: n }, (_, i) => (family === 'binomial' ? (x[i] + rng.normal() > 0 ? 1 : 0) : x[i] - x[n + i] + rng.normal()));

const cases: { family: Family; form: 'design' | 'gram' }[] = [
  { family: 'gaussian', form: 'design' },
  { family: 'gaussian', form: 'gram' },
  { family: 'binomial', form: 'design' },
];

describe('loss roles', () => {
  for (const { family, form } of cases) {
    it(`${family} ${form}: gradient = derivative of the value; evaluate gives X'theta = -gradient`, () => {
      const y = yOf(family);
      const { problem } = prepareProblem({ n, p, x, terms: ['a', 'b', 'c', 'd', 'e'] }, y, { family, penalty: 'lasso', standardize: true, gram: form === 'gram' ? 'always' : 'never' });
      const loss = lossFor(problem, form);
      expect(loss.form).toBe(form);
      const ws = makeWorkingSet(problem.penalty, Int32Array.from({ length: p }, (_, u) => u), loss.intercept);
      const bound = loss.bind(ws);
      const w = Float64Array.from({ length: ws.size }, (_, b) => 0.3 * Math.sin(b + 1));
      const img = new Float64Array(bound.imageSize);
      bound.image(w, img);
      const grad = new Float64Array(ws.size);
      bound.gradient(img, w, grad);
      const h = 1e-6;
      for (let b = 0; b < ws.size; b++) {
        const plus = Float64Array.from(w);
        const minus = Float64Array.from(w);
        plus[b] += h;
        minus[b] -= h;
        const ip = new Float64Array(bound.imageSize);
        const im = new Float64Array(bound.imageSize);
        bound.image(plus, ip);
        bound.image(minus, im);
        expectClose(`d value / d w_${b}`, (bound.value(ip, plus) - bound.value(im, minus)) / (2 * h), grad[b], 1e-7);
      }
      const coef = new Float64Array(p);
      for (let b = 0; b < ws.k; b++) coef[ws.features[b]] = w[b];
      const evaluation = loss.evaluate(coef, loss.intercept ? w[ws.k] : 0);
      expectClose('loss value', evaluation.loss, bound.value(img, w), 1e-12);
      for (let b = 0; b < ws.k; b++) expectClose(`x_${b}'theta`, evaluation.g[ws.features[b]], -grad[b], 1e-12);
    });
  }

  it('gaussian: the Gram and design forms give the same value and gradient', () => {
    const y = yOf('gaussian');
    const { problem } = prepareProblem({ n, p, x, terms: ['a', 'b', 'c', 'd', 'e'] }, y, { family: 'gaussian', penalty: 'lasso', standardize: true, gram: 'always' });
    const coef = Float64Array.from({ length: p }, (_, j) => (j % 2 === 0 ? 0.5 - j / 10 : 0));
    const design = lossFor(problem, 'design').evaluate(coef, 0);
    const gram = lossFor(problem, 'gram').evaluate(coef, 0);
    expectClose('loss', gram.loss, design.loss, 1e-12);
    for (let j = 0; j < p; j++) expectClose(`g_${j}`, gram.g[j], design.g[j], 1e-12);
  });
});
