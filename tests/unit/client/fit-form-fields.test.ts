/**
 * Fit-form errors sit outside the field's <label> (so they do not become part of its accessible name)
 * and are tied to the control by aria-describedby, with aria-invalid set while the value is wrong.
 */
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { useForm } from 'react-hook-form';
import { describe, expect, it } from 'vitest';
import type { FitRequestInput } from '@shared/fits';
import { CvSection } from '@/features/models/components/CvSection';
import { PathSection } from '@/features/models/components/PathSection';

const DEFAULTS: FitRequestInput = { predictors: ['x'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 50 }, cv: { kind: 'folds', folds: 5, seed: 1 }, missing: 'drop' };

function render(section: 'cv' | 'path', extra: Record<string, string>): string {
  function Harness() {
    const form = useForm<FitRequestInput>({ defaultValues: DEFAULTS });
    return section === 'cv' ? createElement(CvSection, { form, columns: [], family: 'gaussian', extra }) : createElement(PathSection, { form, extra });
  }
  return renderToStaticMarkup(createElement(Harness));
}

function labelFor(html: string, id: string): string {
  const m = new RegExp(`<label[^>]*for="${id}"[^>]*>([\\s\\S]*?)</label>`).exec(html);
  expect(m, `a <label for="${id}">`).not.toBeNull();
  return m![1];
}

function controlTag(html: string, id: string): string {
  const m = new RegExp(`<(input|select|textarea)[^>]*id="${id}"[^>]*>`).exec(html);
  expect(m, `a control with id ${id}`).not.toBeNull();
  return m![0];
}

describe('fit form field errors', () => {
  it.each([
    ['cv', 'cv.folds', 'fit-folds', '12 folds need at least 12 rows; this version has 8.'],
    ['path', 'path.pathLength', 'fit-number-of-lambdas', 'Use at least 2 lambdas.'],
  ] as const)('%s section: %s error is outside the label, described-by and invalid', (section, path, id, message) => {
    const html = render(section, { [path]: message });
    expect(labelFor(html, id)).not.toContain(message);
    const control = controlTag(html, id);
    expect(control).toContain('aria-invalid="true"');
    expect(control).toContain(`aria-describedby="${id}-error"`);
    expect(html).toMatch(new RegExp(`id="${id}-error"[^>]*>${message.replace(/[.;]/g, '\\$&')}<`));
    // Without an error the control is neither invalid nor described by an absent message.
    const clean = controlTag(render(section, {}), id);
    expect(clean).not.toContain('aria-invalid');
    expect(clean).not.toContain('aria-describedby');
  });
});
