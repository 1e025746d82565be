/**
 * One file's parse and its columns ready for storage (encoded, with schema and summary), on whichever
 * thread runs it: the parse worker for large files, the request's own thread for small ones.
 */
import { inferColumn, type Inference } from '../parse/infer';
import { parseCsvFile, type ParsedFile } from '../parse/parse-file';
import type { StoredColumn } from '../storage/convert';
import { buildReport, columnSchema, encodeColumn } from './build-columns';
import type { ParseJob, ParseOutcome } from './parse-protocol';
import type { ColumnSchema } from '../../../shared/datasets';

export interface ParsedColumn {
  stored: StoredColumn;
  schema: ColumnSchema;
}

export class ParseSession {
  private constructor(
    private readonly parsed: ParsedFile,
    private readonly inferences: Inference[],
    readonly outcome: ParseOutcome,
  ) {}

  static async open(job: ParseJob, onProgress?: (bytes: number, rows: number) => void): Promise<ParseSession> {
    const parsed = await parseCsvFile({ ...job, onProgress });
    const inferences = parsed.profiles.map(inferColumn);
    const { header, rowCount, reader } = parsed;
    return new ParseSession(parsed, inferences, { header, rowCount, inferences, reader, report: buildReport(parsed, job.fileName, inferences) });
  }

  column(j: number): ParsedColumn {
    const { spill, header, missing } = this.parsed;
    const stored = encodeColumn(spill, j, header[j], this.inferences[j], missing);
    return { stored, schema: columnSchema(stored, j, this.inferences[j]) };
  }

  close(): void {
    this.parsed.spill.close();
  }
}
