/** Issue 8 item 9: HSTS exactly when the public URL is https; the other headers always. */
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { loadConfig } from '../../../server/config';
import type { AppContext } from '../../../server/context';

function appFor(publicUrl: string) {
  const config = loadConfig({ NODE_ENV: 'test', LARIAT_PUBLIC_URL: publicUrl, LARIAT_SERVE_CLIENT: '0' });
  // /api/health touches neither the database nor mail.
  return createApp({ config, db: undefined as unknown as AppContext['db'], queue: undefined as unknown as AppContext['queue'], sendMail: async () => undefined });
}

describe('security headers', () => {
  it('sends HSTS and upgrade-insecure-requests when served over https', async () => {
    const res = await request(appFor('https://lariat.example.test')).get('/api/health');
    expect(res.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
    expect(res.headers['content-security-policy']).toContain('upgrade-insecure-requests');
  });

  it('leaves HSTS out over http, and keeps the rest', async () => {
    const res = await request(appFor('http://127.0.0.1:5180')).get('/api/health');
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(res.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
    expect(res.headers['content-security-policy']).toContain("frame-ancestors 'none'");
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
  });
});
