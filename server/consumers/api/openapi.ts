/**
 * The consumer API's OpenAPI 3.1 document (https://spec.openapis.org/oas/v3.1.0), served at
 * GET /api/v1/openapi.json. Its schemas are JSON Schema 2020-12; tests/api/consumers/openapi.test.ts
 * validates the real answers of every route against them, so the document cannot drift from the code.
 */
import { MAX_SCORE_BYTES, MAX_SCORE_ROWS } from '../../../shared/consumers';

const str = { type: 'string' } as const;
const num = { type: 'number' } as const;
const int = { type: 'integer' } as const;
const uuid = { type: 'string', format: 'uuid' } as const;
const time = { type: 'string', format: 'date-time' } as const;
const nullable = (schema: object) => ({ anyOf: [schema, { type: 'null' }] });
const obj = (properties: Record<string, object>, extra: object = {}) => ({ type: 'object', required: Object.keys(properties), properties, additionalProperties: false, ...extra });
const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });

const schemas = {
  Error: obj({ error: { type: 'object', required: ['message'], properties: { message: str, field: str } } }),
  ReleasedModel: obj({
    id: uuid,
    name: str,
    outcome: str,
    family: { enum: ['gaussian', 'binomial'] },
    release: obj({ id: uuid, number: int, fitId: uuid, fitVersion: int, releasedAt: time }),
  }),
  ReleasedModelList: obj({ models: { type: 'array', items: ref('ReleasedModel') } }),
  EncodedColumn: {
    oneOf: [
      obj({ column: str, kind: { const: 'numeric' }, term: str, fillValue: nullable(num) }),
      obj({ column: str, kind: { const: 'categorical' }, levels: { type: 'array', items: obj({ level: str, term: str }) }, fillLevel: nullable(str) }),
    ],
  },
  ReleaseDocument: obj({
    model: obj({ id: uuid, name: str, description: str, outcome: str, family: { enum: ['gaussian', 'binomial'] } }),
    release: obj({ id: uuid, number: int, notes: str, releasedAt: time, releasedBy: nullable(str), restoredFromReleaseId: nullable(uuid) }),
    fit: obj({
      id: uuid,
      version: int,
      engineVersion: str,
      datasetSha256: { type: 'string', pattern: '^[0-9a-f]{64}$' },
      dataset: obj({ id: uuid, name: str, version: int }),
      seed: nullable(int),
      spec: { type: 'object', description: 'The fit spec as run (shared/fits.ts FitSpec).', required: ['family', 'outcome', 'predictors', 'penalty'] },
      rowsFitted: int,
      unconverged: { type: 'boolean' },
    }),
    lambda: obj({ value: num, index: int, rule: { enum: ['minimum', 'one-standard-error', 'manual', 'last'] } }),
    intercept: { ...num, description: 'Original scale.' },
    coefficients: {
      type: 'array',
      description: 'Every term, original scale (applies to the raw column or the level indicator); standardizedValue is on (x - center) / scale.',
      items: obj({ term: str, column: str, level: nullable(str), value: num, standardizedValue: num, selectionShare: nullable(num) }),
    },
    encoding: obj({ columns: { type: 'array', items: ref('EncodedColumn') }, responseLevels: nullable({ type: 'array', items: str, minItems: 2, maxItems: 2 }) }),
    standardization: nullable(obj({ applied: { type: 'boolean' }, terms: { type: 'array', items: obj({ term: str, center: num, scale: num }) } })),
    metrics: obj({
      cv: nullable(obj({ folds: int, metric: str, value: num, standardError: num, all: { type: 'array', items: obj({ metric: str, value: num, standardError: num }) } })),
      holdout: nullable(obj({ rowCount: int, metrics: { type: 'array', items: obj({ name: str, value: num }) } })),
    }),
    cautions: { type: 'array', items: str },
  }),
  ScoreRequest: obj({
    rows: {
      type: 'array',
      minItems: 1,
      maxItems: MAX_SCORE_ROWS,
      items: { type: 'object', additionalProperties: { type: ['number', 'string', 'null'] } },
      description: 'Column name -> value. null is a missing value (filled only if the fit filled gaps); a column absent from a row makes that row an error.',
    },
  }),
  ScoreRow: {
    type: 'object',
    required: ['row', 'linearPredictor', 'error'],
    additionalProperties: false,
    properties: { row: int, linearPredictor: nullable(num), probability: { ...nullable(num), description: 'Binomial only: probability of the class counted as 1.' }, error: nullable(str) },
  },
  ScoreResponse: obj({
    modelId: uuid,
    releaseId: uuid,
    releaseNumber: int,
    fitId: uuid,
    lambda: num,
    family: { enum: ['gaussian', 'binomial'] },
    rowErrors: int,
    rows: { type: 'array', items: ref('ScoreRow') },
    cautions: { type: 'array', items: str },
  }),
};

const errors = (codes: number[]) =>
  Object.fromEntries(codes.map((c) => [String(c), { description: ERROR_TEXT[c], content: { 'application/json': { schema: ref('Error') } } }]));
const ERROR_TEXT: Record<number, string> = {
  400: 'Malformed request (the message names the field).',
  401: 'No key, or an unknown, revoked or expired key.',
  404: 'No released model with this id visible to this key (another workspace, outside the key\'s scope, or never released).',
  413: 'Too many rows or too large a body.',
  415: 'Send application/json or text/csv.',
  422: 'The CSV lacks a column the release uses.',
  429: 'Too many requests for this key this minute, or too many refused keys from this address (see Retry-After).',
};
const modelId = { name: 'modelId', in: 'path', required: true, schema: uuid };

export function openApiDocument(serverUrl: string) {
  return {
    openapi: '3.1.0',
    info: {
      title: 'Lariat consumer API',
      version: '1',
      description:
        'Read released fits and score rows with them. Authenticate with an API key made by a workspace admin: `Authorization: Bearer lariat_...`. A key sees the released models of its workspace (or the models it was scoped to). Every answer carries the statistical cautions.',
    },
    servers: [{ url: `${serverUrl}/api/v1` }],
    security: [{ apiKey: [] }],
    components: { schemas, securitySchemes: { apiKey: { type: 'http', scheme: 'bearer', description: 'A Lariat API key (lariat_...).' } } },
    paths: {
      '/models': {
        get: {
          operationId: 'listReleasedModels',
          summary: 'Released models visible to this key, each with its current release.',
          responses: { '200': { description: 'The models.', content: { 'application/json': { schema: ref('ReleasedModelList') } } }, ...errors([401, 429]) },
        },
      },
      '/models/{modelId}/release': {
        get: {
          operationId: 'getCurrentRelease',
          summary: 'The current release of a model: coefficients, encoding, standardization, lambda, metrics, spec, checksum, engine version.',
          parameters: [modelId],
          responses: { '200': { description: 'The release document.', content: { 'application/json': { schema: ref('ReleaseDocument') } } }, ...errors([401, 404, 429]) },
        },
      },
      '/models/{modelId}/score': {
        post: {
          operationId: 'scoreRows',
          summary: 'Scores rows with the current release: linear predictor and, for binomial, the probability; a per-row error for rows that cannot be scored.',
          parameters: [modelId],
          requestBody: {
            required: true,
            description: `At most ${MAX_SCORE_ROWS} rows and ${MAX_SCORE_BYTES} bytes.`,
            content: {
              'application/json': { schema: ref('ScoreRequest') },
              'text/csv': { schema: { type: 'string', description: 'A header row naming the columns, then one line per row.' } },
            },
          },
          responses: { '200': { description: 'One result per row, in order.', content: { 'application/json': { schema: ref('ScoreResponse') } } }, ...errors([400, 401, 404, 413, 415, 422, 429]) },
        },
      },
      '/openapi.json': {
        get: { operationId: 'openApiDocument', summary: 'This document.', security: [], responses: { '200': { description: 'OpenAPI 3.1 document.', content: { 'application/json': { schema: { type: 'object' } } } } } },
      },
    },
  };
}
