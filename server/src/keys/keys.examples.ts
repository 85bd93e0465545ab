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
  allowedOrigins: [],
};

/** A key limited to the web origins of a dealer's portal and a developer's own computer. */
export const LIMITED_API_KEY_EXAMPLE = {
  ...KEY_SUMMARY,
  id: 3,
  name: 'Dealer portal (browser)',
  prefix: 'cpk_cG9ydGFs',
  limitPerMinute: 60,
  allowedOrigins: ['https://portal.example.com', 'http://localhost:4200'],
};

export const API_KEY_LIST_EXAMPLE = { keys: [KEY_SUMMARY, LIMITED_API_KEY_EXAMPLE] };

export const VISITOR_TOKEN_EXAMPLE = {
  token: 'eyJhbGciOiJIUzI1NiIsInR5cCI6ImNwLXZpc2l0b3Irand0In0.eyJrZXkiOjJ9.c2lnbmF0dXJlLW9mLXRoZS1leGFtcGxl',
  expiresAt: '2026-05-04T09:22:30.000Z',
};

export const CREATED_API_KEY_EXAMPLE = {
  key: 'cpk_Q2xvY2s5bWFkZS11cC1mb3ItdGhlLWV4YW1wbGU0abc',
  summary: KEY_SUMMARY,
};
