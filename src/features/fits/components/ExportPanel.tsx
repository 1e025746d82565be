/**
 * Downloads of a finished fit at its chosen lambda (plain links: GET routes, the session cookie goes
 * along): the coefficients as CSV, the whole fit as JSON, PMML 4.4 for other scoring tools, and the
 * reproducibility bundle (spec, dataset checksum, engine version, seed and the CLI command). Each
 * file carries the cautions shown above.
 */
const EXPORTS = [
  { file: 'coefficients.csv', label: 'Coefficients (CSV)', about: 'every term at the chosen lambda, original and standardized, with selection shares' },
  { file: 'fit.json', label: 'Whole fit (JSON)', about: 'the full path, cross-validation, certificates and evaluation' },
  { file: 'model.pmml', label: 'PMML 4.4', about: 'the chosen lambda as a regression model other tools can score' },
  { file: 'bundle.json', label: 'Reproducibility bundle', about: 'spec, dataset checksum, engine version, seed and the command that runs it again' },
] as const;

export function ExportPanel({ workspaceId, fitId }: { workspaceId: string; fitId: string }) {
  return (
    <section aria-labelledby="export-heading" className="space-y-2 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="export-heading" className="text-lg font-bold">
        Export
      </h2>
      <ul className="space-y-1 text-sm">
        {EXPORTS.map((e) => (
          <li key={e.file}>
            <a className="font-bold text-lariat-800 underline dark:text-lariat-200" href={`/api/workspaces/${workspaceId}/fits/${fitId}/exports/${e.file}`} download>
              {e.label}
            </a>{' '}
            <span className="text-slate-700 dark:text-slate-300">: {e.about}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
