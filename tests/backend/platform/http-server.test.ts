import type { AddressInfo } from 'node:net';
import express from 'express';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHttpServer } from '../../../backend/src/lib/http-server';

const app = express();
app.use(express.json());
app.get('/prototypes', (req, res) => {
  res.json({
    request: Object.getPrototypeOf(req) === app.request,
    response: Object.getPrototypeOf(res) === app.response,
    path: req.path,
    query: req.query,
    accepts: req.accepts('json'),
  });
});
app.post('/echo', (req, res) => {
  res.status(201).set('x-check', 'yes').json({ got: req.body });
});
const server = createHttpServer(app);
// What each request and response looked like when they arrived, before Express saw them.
const arrivals: Array<{ request: boolean; response: boolean }> = [];
server.prependListener('request', (req, res) => {
  arrivals.push({
    request: Object.getPrototypeOf(req) === app.request,
    response: Object.getPrototypeOf(res) === app.response,
  });
});
let base = '';

beforeAll(async () => {
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
});

describe('the HTTP server for the Express app', () => {
  it("creates requests and responses with Express's own prototypes, so Express need not swap them", async () => {
    const res = await fetch(`${base}/prototypes?team=7`);
    expect(arrivals.at(-1)).toEqual({ request: true, response: true });
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({
      request: true,
      response: true,
      path: '/prototypes',
      query: { team: '7' },
      accepts: 'json',
    });
  });

  it('serves requests with bodies, status codes and headers as Express does, many at once', async () => {
    const answers = await Promise.all(
      Array.from({ length: 40 }, (_, i) =>
        fetch(`${base}/echo`, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ i }),
        }),
      ),
    );
    for (const [i, res] of answers.entries()) {
      expect(res.status).toBe(201);
      expect(res.headers.get('x-check')).toBe('yes');
      expect(await res.json()).toEqual({ got: { i } });
    }
  });
});
