import { OpenAPIRegistry } from '@asteasolutions/zod-to-openapi';
import express, { type RequestHandler } from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import * as z from 'zod';
import { buildOpenApiDocument } from '../openapi/openapi';
import { servedRoutes } from '../openapi/served-routes';
import { IdParamSchema } from './params';
import { HttpProblem, problemHandler } from './problem';
import { problemResponse } from '../openapi/responses';
import { RouteTable, toExpressPath } from './route';

const Body = z.object({ name: z.string().min(1, { error: 'Enter a name.' }) });
const Answer = z.object({ id: z.number(), name: z.string() });

/** A guard that lets a request through when it carries `X-Let-In: yes`. */
const letIn: RequestHandler = (req, _res, next) => {
  if (req.headers['x-let-in'] === 'yes') next();
  else next(new HttpProblem(403, 'Forbidden', 'Not you.'));
};

function build() {
  const registry = new OpenAPIRegistry();
  const table = new RouteTable({
    basePath: '/api/v1',
    registry,
    tag: 'Things',
    access: {
      open: { guard: [], describe: 'Anyone.' },
      member: {
        guard: [letIn],
        security: [{ Member: [] }],
        responses: { 403: problemResponse('Not a member.') },
        describe: 'Members only.',
      },
    },
  });
  const seen: unknown[] = [];
  table
    .add({
      method: 'post',
      path: '/things/{id}',
      summary: 'Rename a thing',
      access: 'member',
      params: IdParamSchema,
      body: Body,
      bodyExample: { name: 'Drum' },
      answer: { status: 201, description: 'Renamed.', schema: Answer, example: { id: 3, name: 'Drum' } },
      problems: { 404: 'No such thing.' },
      handle: ({ params, body }) => {
        seen.push({ params, body });
        if (params.id === 404) throw new HttpProblem(404, 'Not Found', 'No thing 404.');
        return { id: params.id, name: body.name };
      },
    })
    .add({
      method: 'delete',
      path: '/things/{id}',
      summary: 'Forget a thing',
      access: 'open',
      params: IdParamSchema,
      answer: { status: 204, description: 'Forgotten.' },
      handle: () => undefined,
    });
  const app = express();
  app.use('/api/v1', table.router);
  app.use(problemHandler(() => undefined));
  return { app, registry, seen };
}

describe('RouteTable', () => {
  it('mounts a route with its guard, parsed parameters and body, and the answer’s status', async () => {
    const { app, seen } = build();
    const response = await request(app)
      .post('/api/v1/things/3')
      .set('X-Let-In', 'yes')
      .send({ name: 'Drum' })
      .expect(201);
    expect(response.body).toEqual({ id: 3, name: 'Drum' });
    expect(seen).toEqual([{ params: { id: 3 }, body: { name: 'Drum' } }]);
  });

  it('runs the guard before anything else reads the request', async () => {
    const { app, seen } = build();
    await request(app).post('/api/v1/things/x').send('not json').expect(403);
    expect(seen).toEqual([]);
  });

  it('answers problems naming the parameter or field at fault, and 415 for a body that is not JSON', async () => {
    const { app } = build();
    const badId = await request(app).post('/api/v1/things/0').set('X-Let-In', 'yes').send({ name: 'A' });
    expect(badId.status).toBe(400);
    expect(badId.body.errors[0].path).toBe('id');
    const badBody = await request(app).post('/api/v1/things/3').set('X-Let-In', 'yes').send({ name: '' });
    expect(badBody.status).toBe(400);
    expect(badBody.headers['content-type']).toContain('application/problem+json');
    expect(badBody.body.errors).toEqual([{ path: 'name', message: 'Enter a name.' }]);
    const notJson = await request(app)
      .post('/api/v1/things/3')
      .set('X-Let-In', 'yes')
      .type('text/plain')
      .send('name=A');
    expect(notJson.status).toBe(415);
    await request(app).post('/api/v1/things/404').set('X-Let-In', 'yes').send({ name: 'A' }).expect(404);
  });

  it('answers 204 with no body', async () => {
    const { app } = build();
    const response = await request(app).delete('/api/v1/things/3').expect(204);
    expect(response.text).toBe('');
  });

  it('documents each route from the same declaration', () => {
    const { registry } = build();
    const document = buildOpenApiDocument([registry], '0.0.0');
    const post = (document.paths?.['/api/v1/things/{id}'] as Record<string, Record<string, unknown>>)[
      'post'
    ]!;
    expect(post['summary']).toBe('Rename a thing');
    expect(post['description']).toBe('Members only.');
    expect(post['tags']).toEqual(['Things']);
    expect(post['security']).toEqual([{ Member: [] }]);
    expect(Object.keys(post['responses'] as object).sort()).toEqual(['201', '400', '403', '404']);
    const example = (post['requestBody'] as { content: Record<string, { example: unknown }> }).content[
      'application/json'
    ]!.example;
    expect(Body.parse(example)).toEqual({ name: 'Drum' });
    const remove = (document.paths?.['/api/v1/things/{id}'] as Record<string, Record<string, unknown>>)[
      'delete'
    ]!;
    expect(Object.keys(remove['responses'] as object).sort()).toEqual(['204', '400']);
  });

  it('serves exactly what it documents', () => {
    const { app } = build();
    expect(servedRoutes(app).map((route) => `${route.method} ${route.path}`)).toEqual([
      'post /api/v1/things/{id}',
      'delete /api/v1/things/{id}',
    ]);
  });

  it('validates and documents the request headers a route declares', async () => {
    const table = new RouteTable({ basePath: '/api/v1', tag: 'Things', access: { open: { guard: [] } } });
    const Headers = z.object({
      'if-match': z
        .string()
        .regex(/^"\d+"$/, { error: 'Send a quoted version.' })
        .optional(),
    });
    table.add<undefined, undefined, undefined, typeof Answer, typeof Headers>({
      method: 'post',
      path: '/things/{id}/archive',
      summary: 'Archive a thing',
      access: 'open',
      headers: Headers,
      answer: { status: 200, description: 'Archived.', schema: Answer },
      handle: ({ headers }) => ({ id: 1, name: headers['if-match'] ?? 'none' }),
    });
    const app = express();
    app.use('/api/v1', table.router);
    app.use(problemHandler(() => undefined));
    const sent = await request(app).post('/api/v1/things/1/archive').set('If-Match', '"3"').expect(200);
    expect(sent.body).toEqual({ id: 1, name: '"3"' });
    await request(app).post('/api/v1/things/1/archive').expect(200, { id: 1, name: 'none' });
    const wrong = await request(app).post('/api/v1/things/1/archive').set('If-Match', 'W/3').expect(400);
    expect(wrong.body.errors).toEqual([{ path: 'if-match', message: 'Send a quoted version.' }]);
    const document = buildOpenApiDocument([table.registry], '0.0.0');
    const operation = (
      document.paths?.['/api/v1/things/{id}/archive'] as Record<string, Record<string, unknown>>
    )['post']!;
    expect(operation['parameters']).toContainEqual(
      expect.objectContaining({ name: 'if-match', in: 'header', required: false }),
    );
    expect(Object.keys(operation['responses'] as object).sort()).toEqual(['200', '400']);
  });

  it('leaves the answer to a handler that writes it itself, and fails one that answers nothing', async () => {
    const table = new RouteTable({ basePath: '/api/v1', tag: 'Things', access: { open: { guard: [] } } });
    table
      .add<undefined, undefined, undefined, typeof Answer>({
        method: 'post',
        path: '/sessions',
        summary: 'Open a session',
        access: 'open',
        answer: { status: 200, description: 'Opened.', schema: Answer },
        handle: ({ res }) => {
          res.cookie('session', 'abc', { httpOnly: true }).status(201).json({ id: 7, name: 'Session' });
          return undefined;
        },
      })
      .add<undefined, undefined, undefined, typeof Answer>({
        method: 'get',
        path: '/sessions',
        summary: 'Forget to answer',
        access: 'open',
        answer: { status: 200, description: 'The sessions.', schema: Answer },
        handle: () => undefined,
      });
    const app = express();
    app.use('/api/v1', table.router);
    app.use(problemHandler(() => undefined));
    const written = await request(app).post('/api/v1/sessions').expect(201);
    expect(written.headers['set-cookie']?.[0]).toMatch(/^session=abc; .*HttpOnly/);
    expect(written.body).toEqual({ id: 7, name: 'Session' });
    const forgotten = await request(app).get('/api/v1/sessions').expect(500);
    expect(forgotten.headers['content-type']).toContain('application/problem+json');
  });

  it('takes a body that is not JSON through its own parser, and documents answers that are not JSON', async () => {
    const registry = new OpenAPIRegistry();
    const table = new RouteTable({
      basePath: '/api/v1',
      registry,
      tag: 'Things',
      access: { open: { guard: [] } },
    });
    table
      .add({
        method: 'post',
        path: '/things/import',
        summary: 'Count the lines of a CSV file',
        access: 'open',
        rawBody: {
          parse: [express.text({ type: 'text/csv', limit: '1kb' })],
          content: { 'text/csv': { schema: { type: 'string' } } },
          description: 'One thing per line.',
        },
        answer: { status: 200, description: 'Counted.', schema: Answer },
        handle: ({ req }) => ({ id: String(req.body).trim().split('\n').length, name: 'lines' }),
      })
      .add({
        method: 'get',
        path: '/things/export',
        summary: 'The things as CSV',
        access: 'open',
        answer: {
          status: 200,
          description: 'The file.',
          content: { 'text/csv': { schema: { type: 'string', format: 'binary' } } },
        },
        handle: ({ res }) => {
          res.type('text/csv').send('id,name\n3,Drum\n');
          return undefined;
        },
      })
      .add({
        method: 'get',
        path: '/things/forgotten',
        summary: 'Forget to write the file',
        access: 'open',
        answer: {
          status: 200,
          description: 'The file.',
          content: { 'text/csv': { schema: { type: 'string' } } },
        },
        handle: () => undefined,
      });
    const app = express();
    app.use('/api/v1', table.router);
    app.use(problemHandler(() => undefined));
    const counted = await request(app)
      .post('/api/v1/things/import')
      .set('Content-Type', 'text/csv')
      .send('a\nb\nc\n')
      .expect(200);
    expect(counted.body).toEqual({ id: 3, name: 'lines' });
    const file = await request(app).get('/api/v1/things/export').expect(200);
    expect(file.headers['content-type']).toContain('text/csv');
    expect(file.text).toBe('id,name\n3,Drum\n');
    await request(app).get('/api/v1/things/forgotten').expect(500);
    const paths = buildOpenApiDocument([registry], '0.0.0').paths ?? {};
    expect(paths['/api/v1/things/import']?.post?.requestBody).toEqual({
      required: true,
      description: 'One thing per line.',
      content: { 'text/csv': { schema: { type: 'string' } } },
    });
    expect(paths['/api/v1/things/export']?.get?.responses?.['200']).toEqual({
      description: 'The file.',
      content: { 'text/csv': { schema: { type: 'string', format: 'binary' } } },
    });
  });

  it('refuses a route declared with both a JSON body and a raw body', () => {
    const table = new RouteTable({ basePath: '/api/v1', tag: 'Things', access: { open: { guard: [] } } });
    expect(() =>
      table.add({
        method: 'post',
        path: '/things',
        summary: 'Both',
        access: 'open',
        body: Body,
        rawBody: { parse: [], content: { 'text/csv': { schema: { type: 'string' } } } },
        answer: { status: 204, description: 'Nothing.' },
        handle: () => undefined,
      }),
    ).toThrow(/both a JSON body and a raw body/);
  });

  it('documents in a registry of its own unless given one', () => {
    const table = new RouteTable({ basePath: '/api/v1', tag: 'Things', access: { open: { guard: [] } } });
    const other = new RouteTable({ basePath: '/api/v1', tag: 'Things', access: { open: { guard: [] } } });
    table.add({
      method: 'delete',
      path: '/things/{id}',
      summary: 'Forget a thing',
      access: 'open',
      params: IdParamSchema,
      answer: { status: 204, description: 'Forgotten.' },
      handle: () => undefined,
    });
    expect(table.registry.definitions).toHaveLength(1);
    expect(other.registry.definitions).toHaveLength(0);
  });

  it('writes OpenAPI path parameters the way Express reads them', () => {
    expect(toExpressPath('/customers/{id}/contacts/{contactId}')).toBe('/customers/:id/contacts/:contactId');
  });
});
