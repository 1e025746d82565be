/** Missing-value markers, compared after trimming blanks and ignoring case ("na" = "NA"). */
export interface MissingTest {
  markers: string[];
  isMissing(cell: string): boolean;
}

export function missingTest(markers: string[]): MissingTest {
  const set = new Set(markers.map((m) => m.trim().toLowerCase()));
  const longest = Math.max(0, ...[...set].map((m) => m.length));
  return {
    markers,
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
