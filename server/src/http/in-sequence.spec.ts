import express, { type RequestHandler } from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { inSequence } from './in-sequence';
import { problemHandler } from './problem';

function appWith(handler: RequestHandler) {
  const errors: unknown[] = [];
  const app = express();
  app.post('/x', handler, (_req, res) => {
    res.json({ fellThrough: true });
  });
  app.use(problemHandler((_message, error) => errors.push(error)));
  return { app, errors };
}

describe('inSequence', () => {
  it('runs the handlers in order, then goes on to the next layer', async () => {
    const seen: string[] = [];
    const step =
      (name: string): RequestHandler =>
      (_req, _res, next) => {
        seen.push(name);
        next();
      };
    const { app } = appWith(inSequence(step('a'), express.json(), step('b')));
    const response = await request(app).post('/x').send({ n: 1 }).expect(200);
    expect(response.body).toEqual({ fellThrough: true });
    expect(seen).toEqual(['a', 'b']);
  });

  it('skips the rest on an error, a throw after an asynchronous body parser, or a rejected promise', async () => {
    const after: RequestHandler = (_req, res) => {
      res.json({ reached: true });
    };
    const failing: RequestHandler[] = [
      (_req, _res, next) => next(new Error('passed on')),
      () => {
        throw new Error('thrown');
      },
      () => Promise.reject(new Error('rejected')) as never,
    ];
    for (const fail of failing) {
      const { app, errors } = appWith(inSequence(express.json(), fail, after));
      const response = await request(app).post('/x').send({ n: 1 });
      expect(response.status).toBe(500);
      expect(response.body.reached).toBeUndefined();
      expect(errors).toHaveLength(1);
    }
  });
});
