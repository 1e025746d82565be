/**
 * Server-side request forgery defence for webhooks (OWASP SSRF Prevention Cheat Sheet): a webhook
 * URL may not point at this server, nor at a private, loopback, link-local or otherwise non-public
 * address, unless its host is listed in LARIAT_WEBHOOK_ALLOWED_HOSTS. The host is resolved and EVERY
 * address is checked (one private address among public ones is enough to refuse), at registration
 * and again at each delivery through the socket's own lookup (guardedLookup), so a name that
 * re-resolves to 127.0.0.1 after registration (DNS rebinding) is refused at connection time too.
 */
import { lookup as dnsLookup } from 'node:dns';
import { promises as dns } from 'node:dns';
import { BlockList, isIP, type LookupFunction } from 'node:net';
import type { Config } from '../../config';

const blocked = new BlockList();
for (const [net, prefix] of [
  ['0.0.0.0', 8], ['10.0.0.0', 8], ['100.64.0.0', 10], ['127.0.0.0', 8], ['169.254.0.0', 16], ['172.16.0.0', 12],
  ['192.0.0.0', 24], ['192.0.2.0', 24], ['192.168.0.0', 16], ['198.18.0.0', 15], ['198.51.100.0', 24], ['203.0.113.0', 24],
  ['224.0.0.0', 4], ['240.0.0.0', 4],
] as const) blocked.addSubnet(net, prefix, 'ipv4');
for (const [net, prefix] of [['::', 128], ['::1', 128], ['fc00::', 7], ['fe80::', 10], ['ff00::', 8], ['64:ff9b::', 96], ['2001:db8::', 32]] as const) blocked.addSubnet(net, prefix, 'ipv6');

/** True when the address is not a public unicast address. */
export function isPrivateAddress(address: string): boolean {
  const family = isIP(address);
  if (family === 4) return blocked.check(address, 'ipv4');
  if (family === 6) {
    const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(address);
    if (mapped) return blocked.check(mapped[1], 'ipv4');
    return blocked.check(address, 'ipv6');
  }
  return true; // not an address at all: refuse
}

function allowedHosts(config: Config): Set<string> {
  return new Set(config.LARIAT_WEBHOOK_ALLOWED_HOSTS.split(',').map((h) => h.trim().toLowerCase()).filter(Boolean));
}

const bare = (host: string) => host.replace(/^\[|\]$/g, '').toLowerCase();
const portOf = (url: URL) => url.port || (url.protocol === 'https:' ? '443' : '80');

/** The URL's problem in plain words, or null when it may be called. */
export async function webhookUrlProblem(config: Config, raw: string): Promise<string | null> {
  const url = new URL(raw);
  if (url.username || url.password) return 'The address may not carry a user name or password.';
  const self = new URL(config.publicUrl);
  const host = bare(url.hostname);
  const servesHere = (h: string) => (bare(self.hostname) === h && portOf(self) === portOf(url)) || (portOf(url) === String(config.LARIAT_PORT) && isLoopbackName(h));
  if (servesHere(host)) return 'The address points at this Lariat server itself.';
  let addresses: string[];
  if (isIP(host)) addresses = [host];
  else {
    try {
      addresses = (await dns.lookup(host, { all: true, verbatim: true })).map((a) => a.address);
    } catch {
      return `The host ${host} could not be resolved.`;
    }
  }
  if (addresses.some((a) => servesHere(a))) return 'The address points at this Lariat server itself.';
  if (allowedHosts(config).has(host)) return null;
  const inner = addresses.find(isPrivateAddress);
  if (inner) return `The host ${host} resolves to ${inner}, a private or loopback address; webhooks go to public addresses only (an admin of the server can allow a host with LARIAT_WEBHOOK_ALLOWED_HOSTS).`;
  return null;
}

function isLoopbackName(h: string): boolean {
  return h === 'localhost' || (isIP(h) !== 0 && (h === '::1' || h.startsWith('127.')));
}

/** A socket lookup that refuses private addresses unless the host is allowed (checked again at connect). */
export function guardedLookup(config: Config): LookupFunction {
  const allowed = allowedHosts(config);
  return (hostname, options, callback) => {
    dnsLookup(hostname, { ...options, all: true, verbatim: true }, (error, results) => {
      if (error) return callback(error, '', 4);
      const list = results as unknown as { address: string; family: number }[];
      const inner = list.find((a) => isPrivateAddress(a.address));
      if (inner && !allowed.has(bare(hostname))) return callback(new Error(`refused: ${hostname} resolves to a private address`), '', 4);
      if ((options as { all?: boolean }).all) return (callback as unknown as (e: null, a: typeof list) => void)(null, list);
      callback(null, list[0].address, list[0].family);
    });
  };
}
