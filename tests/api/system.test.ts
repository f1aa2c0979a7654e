import SwaggerParser from '@apidevtools/swagger-parser';
import { Model } from 'objection';
import request from 'supertest';
import { buildPerson } from '../helpers/factories';
import { anonymousAgent, signedInAgent } from '../helpers/session-agent';
import { resetDatabase, startTestApp, type TestApp } from '../helpers/test-app';

let lab: TestApp;
beforeAll(async () => {
  lab = await startTestApp();
});
afterAll(() => lab.close());
beforeEach(() => resetDatabase());

describe('GET /api/health', () => {
  it('200 when the server and its database answer', async () => {
    const response = await request(lab.app).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body).toEqual({ status: 'ok', db: 'ok' });
  });
});

describe('when the database does not answer', () => {
  let down: TestApp;
  beforeAll(async () => {
    // Nothing listens on port 1, so every connection is refused at once.
    down = await startTestApp({ config: { databaseUrl: 'postgres://flakeline:x@127.0.0.1:1/none' } });
  });
  afterAll(async () => {
    await down.close();
    // Creating an app's knex binds the Objection models to it; give them back to the live database.
    Model.knex(lab.knex);
  });

  it('GET /api/health answers 503 degraded', async () => {
    const response = await request(down.app).get('/api/health');
    expect(response.status).toBe(503);
    expect(response.body).toEqual({ status: 'degraded', db: 'unavailable' });
  });

  it('POST /api/auth/sign-in answers 503 database_unavailable in the error envelope, without internals', async () => {
    const { agent, csrfToken } = await anonymousAgent(down.app);
    const response = await agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: 'someone@lab.flakeline.test', password: 'any password at all' });
    expect(response.status).toBe(503);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.body).toEqual({ error: { code: 'database_unavailable', message: expect.any(String) } });
    expect(response.text).not.toMatch(/ECONNREFUSED|127\.0\.0\.1|\bat \S+ \(|node_modules|\.ts:\d+/);
  });
});

describe('unknown API routes', () => {
  it('404 not_found as JSON, not the web app', async () => {
    const response = await request(lab.app).get('/api/no-such-endpoint');
    expect(response.status).toBe(404);
    expect(response.headers['content-type']).toMatch(/^application\/json/);
    expect(response.body.error.code).toBe('not_found');
  });
});

describe('request body size', () => {
  const signInWithPasswordOf = async (bytes: number) => {
    const { agent, csrfToken } = await anonymousAgent(lab.app);
    return agent
      .post('/api/auth/sign-in')
      .set('x-csrf-token', csrfToken)
      .send({ email: 'someone@lab.flakeline.test', password: 'x'.repeat(bytes) });
  };

  it('413 payload_too_large for a JSON body over 100 KiB', async () => {
    const response = await signInWithPasswordOf(101 * 1024);
    expect(response.status).toBe(413);
    expect(response.body.error.code).toBe('payload_too_large');
  });

  it('a body just under 100 KiB is read, and then judged on its fields', async () => {
    const response = await signInWithPasswordOf(99 * 1024);
    expect(response.status).toBe(422);
    expect(Object.keys(response.body.error.fields)).toEqual(['password']);
  });
});

describe('GET /api/openapi.json', () => {
  it('200 with a valid OpenAPI 3 document describing every route', async () => {
    const response = await request(lab.app).get('/api/openapi.json');
    expect(response.status).toBe(200);
    const document = response.body;
    expect(document.openapi).toMatch(/^3\./);

    // The general-purpose reference validator (schema and $ref checks). It changes what it is
    // given, so it gets a copy.
    await expect(SwaggerParser.validate(structuredClone(document))).resolves.toBeDefined();

    const described = Object.entries(document.paths as Record<string, Record<string, unknown>>).flatMap(([path, operations]) =>
      Object.keys(operations).map((method) => `${method.toUpperCase()} ${path}`),
    );
    const mounted = lab.specs.map((spec) => `${spec.method.toUpperCase()} /api${spec.path.replace(/:(\w+)/g, '{$1}')}`);
    expect(described.sort()).toEqual(mounted.sort());
  });
});

describe('Cache-Control on API responses', () => {
  it.each([
    ['a public answer', () => request(lab.app).get('/api/health')],
    ['the API description', () => request(lab.app).get('/api/openapi.json')],
    ['an error', () => request(lab.app).get('/api/auth/session')],
    ['an unknown route', () => request(lab.app).get('/api/no-such-endpoint')],
  ])('no-store on %s', async (_what, send) => {
    const response = await send();
    expect(response.headers['cache-control']).toBe('no-store');
  });

  it('no-store on a signed-in answer about the person', async () => {
    const person = await buildPerson(lab.knex);
    const { agent } = await signedInAgent(lab.app, person.email);
    const response = await agent.get('/api/auth/session').expect(200);
    expect(response.headers['cache-control']).toBe('no-store');
  });
});
