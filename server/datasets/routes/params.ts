/** Path and query parameters of the datasets routes: malformed ids are 404s (they cannot exist). */
import type { Request } from 'express';
import { notFound } from '../../http/errors';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function datasetIdParam(req: Request): string {
  const id = req.params.datasetId;
  if (typeof id !== 'string' || !UUID.test(id)) throw notFound('No such dataset in this workspace.');
  return id;
}

export function versionParam(req: Request): number {
  const raw = req.params.number;
  const n = Number(raw);
  if (typeof raw !== 'string' || !/^\d{1,9}$/.test(raw) || n < 1) throw notFound(`No version "${String(raw)}": versions are numbered 1, 2, 3, ...`);
  return n;
}

export function intQuery(req: Request, name: string, fallback: number): number {
  const raw = req.query[name];
  if (raw === undefined) return fallback;
  const n = Number(raw);
  return Number.isInteger(n) && n >= 0 ? n : fallback;
}

/** RFC 8187 attr-char: everything else in the UTF-8 bytes is percent-encoded. */
const ATTR_CHAR = /^[A-Za-z0-9!#$&+\-.^_`|~]$/;

/**
 * `attachment` with a quoted ASCII fallback (quotes, backslashes, controls and non-ASCII become _)
 * and the exact name in `filename*` (RFC 6266 section 4.3, RFC 8187). encodeURIComponent would leave
 * ' ( ) * unencoded, which the filename* syntax does not allow, and throws on a lone surrogate.
 */
export function contentDisposition(fileName: string): string {
  const ascii = fileName.replace(/[^\x20-\x7e]|["\\]/g, '_');
  let encoded = '';
  for (const byte of Buffer.from(fileName, 'utf8')) {
    const ch = String.fromCharCode(byte);
    encoded += byte < 0x80 && ATTR_CHAR.test(ch) ? ch : `%${byte.toString(16).toUpperCase().padStart(2, '0')}`;
  }
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encoded}`;
}
