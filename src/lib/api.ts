/**
 * The client's single door to the server: JSON in and out, the CSRF header on mutating requests,
 * and every non-2xx answer turned into an ApiError carrying the server's message and field.
 */

/** The server's error body: `{ error: { message, field } }`. */
interface ErrorBody {
  error?: { message?: string; field?: string };
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly field?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export const CSRF_COOKIE = 'lariat_csrf';
export const CSRF_HEADER = 'X-Lariat-CSRF';

function readCookie(name: string): string | undefined {
  for (const part of document.cookie.split(';')) {
    const [key, ...rest] = part.trim().split('=');
    if (key === name) return decodeURIComponent(rest.join('='));
  }
  return undefined;
}

/** The session's CSRF token: from `__Host-lariat_csrf` when served over https, else `lariat_csrf`. */
export function csrfToken(): string | undefined {
  return readCookie(`__Host-${CSRF_COOKIE}`) ?? readCookie(CSRF_COOKIE);
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export async function apiRequest<T>(method: Method, path: string, body?: unknown): Promise<T> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET') {
    const token = csrfToken();
    if (token) headers[CSRF_HEADER] = token;
  }
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'Lariat could not reach the server. Check your connection and try again.');
  }
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  const data: unknown = text ? safeJson(text) : undefined;
  if (!response.ok) {
    const error = (data as ErrorBody | undefined)?.error;
    throw new ApiError(response.status, error?.message ?? `The server answered ${response.status}.`, error?.field);
  }
  return data as T;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

export const api = {
  get: <T>(path: string) => apiRequest<T>('GET', path),
  post: <T>(path: string, body?: unknown) => apiRequest<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => apiRequest<T>('PATCH', path, body),
  delete: <T>(path: string) => apiRequest<T>('DELETE', path),
};

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

/** List endpoints answer either a bare array or `{ [key]: [...] }`; both read the same here. */
export function listFrom<T>(body: T[] | Record<string, T[] | unknown>, key: string): T[] {
  if (Array.isArray(body)) return body;
  const value = body[key];
  return Array.isArray(value) ? (value as T[]) : [];
}
