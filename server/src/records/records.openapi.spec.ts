import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type * as z from 'zod';
import {
  CreateCustomerSchema,
  CreateMachineFamilySchema,
  CreateMachineSchema,
  CustomerListQuerySchema,
  CustomerPageSchema,
  CustomerSchema,
  MachineFamilyPageSchema,
  MachineFamilySchema,
  MachinePageSchema,
  MachineSchema,
  RecordHistorySchema,
  UpdateCustomerSchema,
  UpdateMachineFamilySchema,
  UpdateMachineSchema,
} from '@counterpoise/api';
import { createApp } from '../app';
import type { OpenApiDocument } from '../openapi/openapi';
import { openTemporaryDatabase, type TemporaryDatabase } from '../testing/temporary-database';

let temporary: TemporaryDatabase;
let document: OpenApiDocument;
let firstDocument: OpenApiDocument;
beforeAll(() => {
  temporary = openTemporaryDatabase();
  // Two apps, as tests build many: each documents its own routes, once.
  firstDocument = createApp({ database: temporary.database }).locals.openApiDocument!;
  document = createApp({ database: temporary.database }).locals.openApiDocument!;
});
afterAll(() => temporary.dispose());

interface Operation {
  description?: string;
  security?: unknown;
  requestBody?: { content: Record<string, { example?: unknown }> };
  responses: Record<
    string,
    {
      headers?: Record<string, unknown>;
      content?: Record<string, { example?: unknown; schema?: { $ref?: string } }>;
    }
  >;
}
const operation = (method: string, path: string) =>
  (document.paths?.[path] as Record<string, Operation> | undefined)?.[method];

const KINDS: [string, z.ZodType, z.ZodType, z.ZodType, z.ZodType][] = [
  ['/api/v1/customers', CreateCustomerSchema, UpdateCustomerSchema, CustomerSchema, CustomerPageSchema],
  [
    '/api/v1/machine-families',
    CreateMachineFamilySchema,
    UpdateMachineFamilySchema,
    MachineFamilySchema,
    MachineFamilyPageSchema,
  ],
  ['/api/v1/machines', CreateMachineSchema, UpdateMachineSchema, MachineSchema, MachinePageSchema],
];

describe('the OpenAPI document of the records', () => {
  it.each(KINDS)(
    'documents every route of %s with examples its schemas accept',
    (path, create, update, record, page) => {
      const one = `${path}/{id}`;
      const expectParses = (schema: z.ZodType, example: unknown) =>
        expect(schema.safeParse(example).error).toBeUndefined();
      expectParses(page, operation('get', path)!.responses['200']!.content!['application/json']!.example);
      expectParses(create, operation('post', path)!.requestBody!.content['application/json']!.example);
      expectParses(record, operation('post', path)!.responses['201']!.content!['application/json']!.example);
      expectParses(record, operation('get', one)!.responses['200']!.content!['application/json']!.example);
      expectParses(update, operation('patch', one)!.requestBody!.content['application/json']!.example);
      for (const [method, route] of [
        ['patch', one],
        ['post', `${one}/archive`],
        ['post', `${one}/restore`],
      ] as const) {
        const documented = operation(method, route)!;
        expectParses(record, documented.responses['200']!.content!['application/json']!.example);
        expect(Object.keys(documented.responses).sort()).toEqual([
          '200',
          '400',
          '401',
          '403',
          '404',
          '412',
          '428',
        ]);
        expect(documented.responses['200']!.headers).toHaveProperty('ETag');
        expect(documented.responses['412']!.headers).toHaveProperty('ETag');
        expect(documented.description).toContain('If-Match');
      }
      expectParses(
        RecordHistorySchema,
        operation('get', `${one}/history`)!.responses['200']!.content!['application/json']!.example,
      );
      expect(operation('post', path)!.responses['201']!.headers).toHaveProperty('Location');
      expect(operation('get', path)!.security).toEqual([{ AccessToken: [] }]);
    },
  );

  it('shows the stored record in the 412 answer', () => {
    const schemas = document.components?.schemas as Record<
      string,
      { properties?: Record<string, { $ref?: string }> }
    >;
    expect(schemas['CustomerChangedMeanwhile']?.properties?.['current']?.$ref).toBe(
      '#/components/schemas/Customer',
    );
    expect(schemas['MachineChangedMeanwhile']?.properties?.['current']?.$ref).toBe(
      '#/components/schemas/Machine',
    );
    expect(schemas['MachineFamilyChangedMeanwhile']?.properties?.['current']?.$ref).toBe(
      '#/components/schemas/MachineFamily',
    );
  });

  it('says who may call each route, from the permission table', () => {
    expect(operation('get', '/api/v1/customers')!.description).toContain(
      '`records:read` (owner, manager, technician, viewer)',
    );
    expect(operation('post', '/api/v1/machine-families')!.description).toContain(
      '`families:write` (owner, manager)',
    );
    expect(operation('post', '/api/v1/machines/{id}/archive')!.description).toContain(
      '`records:archive` (owner, manager)',
    );
  });

  it('documents each route once in the document of each app, however many apps are built', () => {
    const operationsUnder = (of: OpenApiDocument, base: string) =>
      Object.entries(of.paths ?? {})
        .filter(([path]) => path === base || path.startsWith(`${base}/`))
        // Other features' routes under a machine (its photos, its job history) are not the records' own.
        .filter(([path]) => !/\/\{id\}\/(photos|job-history)(\/|$)/.test(path))
        .flatMap(([, item]) =>
          Object.keys(item as object).filter((method) => ['get', 'post', 'patch', 'delete'].includes(method)),
        );
    for (const base of ['/api/v1/customers', '/api/v1/machine-families', '/api/v1/machines']) {
      expect(operationsUnder(firstDocument, base)).toHaveLength(7);
      expect(operationsUnder(document, base)).toHaveLength(7);
    }
  });

  it('documents If-Match as a header parameter of every change', () => {
    for (const [method, path] of [
      ['patch', '/api/v1/customers/{id}'],
      ['post', '/api/v1/machines/{id}/archive'],
      ['post', '/api/v1/machine-families/{id}/restore'],
    ] as const) {
      const parameters = (
        document.paths?.[path] as Record<string, { parameters: { name: string; in: string }[] }>
      )[method]!.parameters;
      expect(parameters).toContainEqual(expect.objectContaining({ name: 'if-match', in: 'header' }));
    }
  });

  it('documents the paging parameters as the integers they are', () => {
    const parameters = (
      document.paths?.['/api/v1/customers'] as { get: { parameters: { name: string; schema: unknown }[] } }
    ).get.parameters;
    expect(parameters.find((parameter) => parameter.name === 'pageSize')?.schema).toEqual({
      type: 'integer',
      minimum: 1,
      maximum: 100,
      default: 25,
    });
    expect(CustomerListQuerySchema.parse({ pageSize: '10' }).pageSize).toBe(10);
  });
});
