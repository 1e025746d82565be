/** The log line of an unexpected error never quotes a query (issue 8, item 6). */
import { describe, expect, it } from 'vitest';
import { describeForLog } from '../../../server/http/unexpected';

describe('describeForLog', () => {
  it('leaves out the query text of a wrapped query failure that carries no SQLSTATE', () => {
    const wrapped = new Error('Failed query: insert into "sign_up_requests" ("email") values ($1)\nparams: someone@example.test', { cause: new Error('timeout exceeded when trying to connect') });
    const line = describeForLog(wrapped);
    expect(line, line).not.toMatch(/insert into|sign_up_requests|someone@example/);
    expect(line.startsWith('Error'), line).toBe(true);
  });

  it('keeps the first line of a programming error', () => {
    const line = describeForLog(new TypeError('x is not a function'));
    expect(line, line).toContain('message="x is not a function"');
  });
});
