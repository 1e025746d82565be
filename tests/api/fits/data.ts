/** Invented tables for the fits tests and benchmark (no vitest imports: scripts use it too). */

/** A small invented regression table: y depends on x1, x2 and the level of g; x3.. are noise. */
export function regressionCsv(rows: number, noise: number, seed = 7, extra = ''): string {
  let s = seed >>> 0;
  const rand = () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 4294967296;
  };
  const header = ['y', 'yes', 'x1', 'x2', ...Array.from({ length: noise }, (_, k) => `n${k + 1}`), 'g', 'fold'];
  const lines = [header.join(',') + extra];
  for (let i = 0; i < rows; i++) {
    const x1 = rand() * 4 - 2;
    const x2 = rand() * 4 - 2;
    const ns = Array.from({ length: noise }, () => (rand() * 2 - 1).toFixed(4));
    const g = ['red', 'green', 'blue'][i % 3];
    const y = 1.5 * x1 - 2 * x2 + (g === 'red' ? 1 : 0) + (rand() - 0.5);
    const yes = y + (rand() - 0.5) * 2 > 0 ? 'yes' : 'no';
    lines.push([y.toFixed(4), yes, x1.toFixed(4), x2.toFixed(4), ...ns, g, String((i % 4) + 1)].join(','));
  }
  return `${lines.join('\n')}\n`;
}
