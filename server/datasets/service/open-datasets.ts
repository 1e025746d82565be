/**
 * The bundled open datasets (datasets/open/, provenance in its SOURCES.md), importable into any
 * workspace in one click. The card cites the original publication and data repository; how the
 * files were obtained (the copying route) is recorded only in datasets/open/SOURCES.md.
 */
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { OpenDatasetDto } from '../../../shared/datasets';
import type { Database } from '../../db/client';
import { notFound } from '../../http/errors';
import { findOpenImport } from '../data/datasets';
import { importDatasetFromFile } from './import-file';

export const OPEN_DIR = fileURLToPath(new URL('../../../datasets/open/', import.meta.url));

type OpenEntry = Omit<OpenDatasetDto, 'importedAs'>;

export const OPEN_DATASETS: OpenEntry[] = [
  {
    key: 'diabetes',
    title: 'Diabetes progression (442 patients)',
    fileName: 'diabetes.csv',
    description:
      'Ten baseline measurements (age, sex, body mass index, blood pressure, six blood serum values) and a measure of disease progression one year later. Raw, unscaled values; sex is coded 1/2.',
    citation:
      'Bradley Efron, Trevor Hastie, Iain Johnstone and Robert Tibshirani (2004), "Least Angle Regression", Annals of Statistics 32(2), 407-499, doi:10.1214/009053604000000067. Data page: https://www4.stat.ncsu.edu/~boos/var.select/diabetes.html',
    licence: 'No licence is stated by the authors or on the data page.',
  },
  {
    key: 'breast-cancer',
    title: 'Breast cancer diagnosis (569 masses)',
    fileName: 'breast_cancer.csv',
    description:
      'Thirty measurements of cell nuclei from images of breast masses, and the diagnosis: 0 = malignant (212), 1 = benign (357). Suited to logistic models.',
    citation:
      'W. N. Street, W. H. Wolberg and O. L. Mangasarian (1993), "Nuclear feature extraction for breast tumor diagnosis", IS&T/SPIE Electronic Imaging, vol. 1905, 861-870. Data: W. H. Wolberg, W. N. Street and O. L. Mangasarian (1995), "Breast Cancer Wisconsin (Diagnostic)", UCI Machine Learning Repository, https://archive.ics.uci.edu/ml/datasets/breast+cancer+wisconsin+(diagnostic)',
    licence: 'Creative Commons Attribution 4.0 (CC BY 4.0), as the UCI Machine Learning Repository lists it.',
  },
];

export async function listOpenDatasets(db: Database, workspaceId: string): Promise<OpenDatasetDto[]> {
  const out: OpenDatasetDto[] = [];
  for (const entry of OPEN_DATASETS) out.push({ ...entry, importedAs: await findOpenImport(db, workspaceId, entry.key) });
  return out;
}

export async function importOpenDataset(db: Database, workspaceId: string, userId: string, key: string) {
  const entry = OPEN_DATASETS.find((e) => e.key === key);
  if (!entry) throw notFound(`No open dataset called "${key}". Available: ${OPEN_DATASETS.map((e) => e.key).join(', ')}.`);
  return importDatasetFromFile(db, {
    workspaceId,
    userId,
    name: entry.title,
    description: `${entry.description}\n\nSource: ${entry.citation}`,
    filePath: path.join(OPEN_DIR, entry.fileName),
    openKey: entry.key,
  });
}
