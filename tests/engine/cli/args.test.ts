import { describe, it, expect } from 'vitest';
import { DEFAULTS, FLAG_OPTIONS, parseFitOptions, UsageError, VALUE_OPTIONS } from '../../../server/cli/args';
import { HELP } from '../../../server/cli/help';

const base = ['--data', 'd.csv', '--response', 'y'];

describe('parseFitOptions', () => {
  it('applies the documented defaults: gaussian lasso, 100 lambdas, 10 folds, no term limit', () => {
    const o = parseFitOptions(base);
    expect(o).toMatchObject({ data: 'd.csv', response: 'y', family: 'gaussian', penalty: 'lasso', pathLength: 100, folds: 10, standardize: true });
    expect(o.seed).toBe(DEFAULTS.seed);
    expect(o.predictors).toBeUndefined();
    expect(o.maxTerms).toBeUndefined();
    expect(o.l1Share).toBeUndefined();
  });

  it('reads every option, in both --name value and --name=value forms', () => {
    const o = parseFitOptions([
      ...base, '--predictors', 'a, b,c', '--family=binomial', '--penalty', 'elastic-net', '--l1-share', '0.3',
      '--lambda', '1,0.5,0.1', '--no-standardize', '--fold-column', 'fold', '--seed', '7', '--tolerance', '1e-8',
      '--penalty-weights', 'w.json',
    ]);
    expect(o).toMatchObject({
      predictors: ['a', 'b', 'c'], family: 'binomial', penalty: 'elastic-net', l1Share: 0.3,
      lambda: [1, 0.5, 0.1], standardize: false, foldColumn: 'fold', seed: 7, tolerance: 1e-8,
      penaltyWeightsFile: 'w.json',
    });
  });

  it('reads --path-decades and --max-terms, with their defaults when absent', () => {
    expect(parseFitOptions([...base, '--path-decades', '2.5', '--max-terms', '12'])).toMatchObject({ pathDecades: 2.5, maxTerms: 12 });
    expect(parseFitOptions(base).pathDecades).toBe(DEFAULTS.pathDecades);
  });

  it('takes --folds 0 as no cross-validation', () => {
    expect(parseFitOptions([...base, '--folds', '0']).folds).toBe(0);
  });

  const bad: [string[], RegExp][] = [
    [['--response', 'y'], /--data FILE\.csv is required/],
    [['--data', 'd.csv'], /--response COLUMN is required/],
    [[...base, '--famly', 'gaussian'], /unknown option --famly/],
    [[...base, '--family', 'poisson'], /--family must be one of gaussian, binomial \(got "poisson"\)/],
    [[...base, '--lambda', '0.1,0.5'], /--lambda values must be strictly descending; value 2 \(0\.5\)/],
    [[...base, '--lambda', '1,x'], /--lambda value 2 \("x"\) must be a number/],
    [[...base, '--lambda', '1', '--path-length', '5'], /--lambda cannot be combined/],
    [[...base, '--folds', '1'], /--folds must be 0 \(no cross-validation\) or at least 2/],
    [[...base, '--folds', '2.5'], /--folds must be an integer/],
    [[...base, '--penalty', 'elastic-net', '--l1-share', '0'], /--l1-share must be in \(0, 1\]/],
    [[...base, '--penalty', 'elastic-net'], /--penalty elastic-net needs --l1-share A/],
    [[...base, '--l1-share', '0.5'], /--l1-share applies only to --penalty elastic-net/],
    [[...base, '--alpha', '0.5'], /unknown option --alpha/],
    [[...base, '--groups', 'g.json'], /--groups applies only to --penalty group-lasso/],
    [[...base, '--path-decades', '0'], /--path-decades must be a positive number/],
    [[...base, '--lambda', '1', '--path-decades', '2'], /--lambda cannot be combined/],
    [[...base, '--max-terms', '0'], /--max-terms must be an integer of at least 1/],
    [[...base, '--lambda', '1', '--max-terms', '3'], /--lambda cannot be combined/],
    [[...base, '--lambda-ratio', '0.01'], /unknown option --lambda-ratio/],
    [[...base, '--tolerance', '-1'], /--tolerance must be positive/],
    [[...base, '--seed'], /--seed needs a value/],
    [[...base, '--data', 'e.csv'], /--data is given twice/],
    [[...base, '--folds', '3', '--fold-column', 'f'], /--folds cannot be combined with --fold-column/],
    [[...base, 'stray'], /unexpected argument "stray"/],
  ];
  for (const [argv, message] of bad) {
    it(`rejects ${argv.slice(4).join(' ') || argv.join(' ')}`, () => {
      expect(() => parseFitOptions(argv)).toThrow(UsageError);
      expect(() => parseFitOptions(argv)).toThrow(message);
    });
  }
});

describe('--help', () => {
  it('explains every option the parser accepts', () => {
    for (const name of [...VALUE_OPTIONS, ...FLAG_OPTIONS].filter((n) => n !== 'help')) expect(HELP, `--${name}`).toContain(`--${name}`);
  });

  it('states the measured defaults and no option of the old vocabulary', () => {
    expect(HELP).toContain(`Default ${DEFAULTS.pathDecades}`);
    expect(HELP).toContain(`Default ${DEFAULTS.tolerance}`);
    expect(HELP).toContain('devianceExplained');
    for (const old of ['--alpha', '--lambda-ratio', 'devianceRatio', 'penalty factor']) expect(HELP).not.toContain(old);
  });
});
