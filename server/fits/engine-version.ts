/**
 * The engine version recorded with every fit: the package version and a hash of the engine's source
 * files, so a stored fit names exactly the numerical code that produced it.
 */
import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';

let cached: string | null = null;

function files(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true })
    .flatMap((e) => (e.isDirectory() ? files(join(dir, e.name)) : e.name.endsWith('.ts') ? [join(dir, e.name)] : []))
    .sort();
}

export function engineVersion(): string {
  if (cached) return cached;
  const root = fileURLToPath(new URL('../engine', import.meta.url));
  const hash = createHash('sha256');
  for (const file of files(root)) hash.update(relative(root, file)).update('\0').update(readFileSync(file)).update('\0');
  const pkg = JSON.parse(readFileSync(fileURLToPath(new URL('../../package.json', import.meta.url)), 'utf8')) as { version: string };
  cached = `${pkg.version}+${hash.digest('hex').slice(0, 12)}`;
  return cached;
}
