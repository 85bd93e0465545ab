/*
 * The examples of the key routes in the OpenAPI document. A spec parses each with its schema, so that the
 * reference never shows an example the server would refuse or never send.
 */

const KEY_SUMMARY = {
  id: 2,
  name: 'Dealer portal',
  prefix: 'cpk_Q2xvY2s5',
  limitPerMinute: 600,
  createdAt: '2026-05-04T08:00:00.000Z',
  lastUsedAt: null,
  revokedAt: null,
  allowedOrigins: ['https://portal.example.com'],
};

export const API_KEY_LIST_EXAMPLE = { keys: [KEY_SUMMARY] };

export const CREATED_API_KEY_EXAMPLE = {
  key: 'cpk_Q2xvY2s5bWFkZS11cC1mb3ItdGhlLWV4YW1wbGU0abc',
  summary: KEY_SUMMARY,
};
