/** Missing-value markers, compared after trimming blanks and ignoring case ("na" = "NA"). */
export interface MissingTest {
  markers: string[];
  isMissing(cell: string): boolean;
  /** The same for a cell already trimmed (the parser's hot path). */
  isMissingTrimmed(value: string): boolean;
}

/** The cell without surrounding blanks; the common case (none) costs two character reads. */
export function trimCell(cell: string): string {
  const n = cell.length;
  if (n === 0) return cell;
  const a = cell.charCodeAt(0);
  const b = cell.charCodeAt(n - 1);
  return a <= 32 || b <= 32 || a === 160 || b === 160 ? cell.trim() : cell;
}

export function missingTest(markers: string[]): MissingTest {
  const set = new Set(markers.map((m) => m.trim().toLowerCase()));
  const longest = Math.max(0, ...[...set].map((m) => m.length));
  const trimmed = (t: string) => t.length <= longest && (set.has(t) || set.has(t.toLowerCase()));
  return {
    markers,
    isMissingTrimmed: trimmed,
    isMissing(cell: string): boolean {
      // Cheap tests first: most cells are longer than every marker and need no lower-casing.
      const t = cell.length > longest ? cell.trim() : cell;
      if (t.length > longest) return false;
      return set.has(t) || set.has(t.trim().toLowerCase());
    },
  };
}

/** A decimal number as written in CSV files (no hex, no Infinity, no thousands separators). */
export const DECIMAL = /^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$/;
/** The same, for a cell already trimmed. */
export const DECIMAL_TRIMMED = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
