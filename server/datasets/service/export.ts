/**
 * The cleaned table as CSV (RFC 4180 quoting), typed as the version says, missing cells empty.
 * Spreadsheet formula injection is neutralised as OWASP's "CSV Injection" page advises: a text cell
 * starting with =, +, -, @, tab or carriage return gets a leading apostrophe. Numbers in numeric
 * columns are written as numbers, so -3.5 stays -3.5.
 */
import type { Writable } from 'node:stream';
import type { Database } from '../../db/client';
import { loadStoredColumns } from '../data/uploads';
import { loadAs, type LoadedColumn } from '../storage/convert';
import { requireVersion } from './datasets';

const FORMULA_START = /^[=+\-@\t\r]/;

export function neutralise(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function cellAt(col: LoadedColumn, i: number): string {
  if (col.kind === 'numeric') return Number.isNaN(col.values[i]) ? '' : String(col.values[i]);
  const text = col.kind === 'categorical' ? (col.codes[i] < 0 ? null : col.levels[col.codes[i]]) : col.values[i];
  return text === null ? '' : csvField(neutralise(text));
}

async function write(out: Writable, text: string): Promise<void> {
  if (!out.write(text)) await new Promise((resolve) => out.once('drain', resolve));
}

export async function prepareCleanedCsv(db: Database, scope: { workspaceId: string; datasetId: string; number: number }) {
  const { dataset, version } = await requireVersion(db, scope.workspaceId, scope.datasetId, scope.number);
  const fileName = `${dataset.name.replace(/[^\w.-]+/g, '_')}-v${version.number}-cleaned.csv`;
  return {
    fileName,
    async writeTo(out: Writable): Promise<void> {
      const stored = await loadStoredColumns(db, version.uploadId);
      // Stored numbers are written as numbers whatever the column's type (no apostrophe on -3.5).
      const columns = stored.map((s, j) => loadAs(s, s.storage === 'float64' ? 'numeric' : version.columns[j].type));
      await write(out, `${version.columns.map((c) => csvField(neutralise(c.name))).join(',')}\r\n`);
      const batch: string[] = [];
      for (let i = 0; i < version.rowCount; i++) {
        batch.push(columns.map((c) => cellAt(c, i)).join(','));
        if (batch.length === 5000 || i === version.rowCount - 1) {
          await write(out, `${batch.join('\r\n')}\r\n`);
          batch.length = 0;
        }
      }
    },
  };
}
