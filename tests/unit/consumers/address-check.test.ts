/**
 * Which webhook addresses count as private (OWASP SSRF Prevention Cheat Sheet; ranges from IANA's
 * special-purpose address registries, RFC 6890, from memory), and the refusal rules that
 * need no network: the server itself, credentials in the URL, the allow-list.
 */
import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../../server/config';
import { isPrivateAddress, webhookUrlProblem } from '../../../server/consumers/webhooks/address-check';

describe('isPrivateAddress', () => {
  it.each([
    '127.0.0.1', '127.255.0.9', '10.0.0.1', '172.16.0.1', '172.31.255.255', '192.168.1.1', '169.254.169.254', '100.64.0.1',
    '0.0.0.0', '224.0.0.1', '255.255.255.255', '::1', '::', 'fe80::1', 'fc00::1', 'fd12:3456::1', '::ffff:127.0.0.1', '::ffff:10.1.2.3', 'not-an-address',
  ])('%s is private or not an address', (a) => {
    expect(isPrivateAddress(a)).toBe(true);
  });
  it.each(['8.8.8.8', '172.32.0.1', '172.15.255.255', '1.1.1.1', '2606:4700:4700::1111', '::ffff:8.8.4.4'])('%s is public', (a) => {
    expect(isPrivateAddress(a)).toBe(false);
  });
});

describe('webhookUrlProblem without the network', () => {
  const config = loadConfig({ NODE_ENV: 'test', LARIAT_PORT: '5180', LARIAT_WEBHOOK_ALLOWED_HOSTS: '127.0.0.1' });
  it('refuses the server itself even when its host is allowed, and credentials in the URL', async () => {
    expect(await webhookUrlProblem(config, 'http://127.0.0.1:5180/x')).toMatch(/itself/);
    expect(await webhookUrlProblem(config, 'http://u:p@8.8.8.8/x')).toMatch(/user name or password/);
  });
  it('allows a listed private host on another port, refuses an unlisted one, allows a public address', async () => {
    expect(await webhookUrlProblem(config, 'http://127.0.0.1:9999/x')).toBeNull();
    expect(await webhookUrlProblem(config, 'http://10.0.0.1/x')).toMatch(/private/);
    expect(await webhookUrlProblem(config, 'https://8.8.8.8/x')).toBeNull();
  });
});
