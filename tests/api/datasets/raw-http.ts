/** A raw HTTP client for uploads that must be cut off or stopped mid-way (supertest sends whole bodies). */
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type express from 'express';
import request from 'supertest';
import { signUp } from '../../support/session';

export interface RawSession {
  cookie: string;
  csrf: string;
  workspaceId: string;
}

export async function rawSignUp(app: express.Express, email: string): Promise<RawSession> {
  // Sign-up finishes through an e-mailed link; then a fresh sign-in gives the cookies to replay.
  await signUp(app, { email, password: 'correct horse battery staple', name: 'Raw Tester' });
  const res = await request(app).post('/api/auth/sign-in').send({ email, password: 'correct horse battery staple' });
  if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${JSON.stringify(res.body)}`);
  const cookies = (res.headers['set-cookie'] as unknown as string[]).map((c) => c.split(';')[0]);
  return { cookie: cookies.join('; '), csrf: res.body.csrfToken, workspaceId: res.body.memberships[0].workspaceId };
}

export function listen(app: express.Express): Promise<{ server: http.Server; port: number }> {
  return new Promise((resolve) => {
    const server = http.createServer(app).listen(0, '127.0.0.1', () => resolve({ server, port: (server.address() as AddressInfo).port }));
  });
}

export const BOUNDARY = 'lariat-test-boundary';

export function multipartHead(fileName: string): string {
  return `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="${fileName}"\r\nContent-Type: text/csv\r\n\r\n`;
}

/** Starts a chunked multipart POST; the caller writes the body and ends or destroys it. */
export function startUpload(port: number, s: RawSession, ingest: string): http.ClientRequest {
  return http.request({
    host: '127.0.0.1',
    port,
    method: 'POST',
    path: `/api/workspaces/${s.workspaceId}/datasets/uploads?ingest=${ingest}`,
    headers: { 'Content-Type': `multipart/form-data; boundary=${BOUNDARY}`, Cookie: s.cookie, 'X-Lariat-CSRF': s.csrf },
  });
}
