/** Checks on the header row: every column named, names unique, within the column limit. */
import { FileProblem } from './errors';

export function checkHeader(raw: string[], fileName: string, columnLimit: number): string[] {
  const header = raw.map((h) => h.trim());
  if (header.length === 1 && header[0] === '') {
    throw new FileProblem(`${fileName}: the first line is blank; it should be the header row with the column names.`);
  }
  if (header.length > columnLimit) {
    throw new FileProblem(`${fileName} has ${header.length} columns; the limit is ${columnLimit}.`);
  }
  if (header.length < 2) {
    throw new FileProblem(
      `${fileName} has a single column ("${header[0]}"). A model needs at least two columns (an outcome and a predictor); ` +
        'if the file uses a delimiter other than comma, tab, semicolon or vertical bar, convert it first.',
    );
  }
  const seen = new Map<string, number>();
  header.forEach((name, j) => {
    if (name === '') throw new FileProblem(`${fileName}: column ${j + 1} has no name in the header row.`, 400, 'file');
    const first = seen.get(name);
    if (first !== undefined) {
      throw new FileProblem(`${fileName}: the column name "${name}" appears twice in the header row (columns ${first + 1} and ${j + 1}).`);
    }
    seen.set(name, j);
  });
  return header;
}
