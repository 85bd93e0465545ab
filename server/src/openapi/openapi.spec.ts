import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { HealthSchema } from '@counterpoise/api';
import { createApp } from '../app';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

let temporary: TemporaryDatabase;
beforeEach(() => (temporary = openTemporaryDatabase()));
afterEach(() => temporary.dispose());

describe('the OpenAPI document', () => {
  it('is OpenAPI 3.1 with the version of the server and the health route', async () => {
    const response = await request(createApp({ database: temporary.database, version: '1.2.3' }))
      .get('/api/openapi.json')
      .expect(200);
    expect(response.body.openapi).toBe('3.1.0');
    expect(response.body.info.version).toBe('1.2.3');
    expect(Object.keys(response.body.paths)).toContain('/api/health');
  });

  it('carries schema examples that the schemas themselves accept', () => {
    const document = createApp({ database: temporary.database }).locals.openApiDocument!;
    const health = document.components?.schemas?.['Health'] as { example?: unknown } | undefined;
    expect(health?.example).toBeDefined();
    expect(HealthSchema.safeParse(health?.example).success).toBe(true);
  });

  it('is browsable in Swagger UI', async () => {
    const response = await request(createApp({ database: temporary.database }))
      .get('/api/docs/')
      .expect(200);
    expect(response.text).toContain('Counterpoise API reference');
  });
});
