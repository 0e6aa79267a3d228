// Request logs and transport (issue 10): a request id in X-Request-Id and in every 500 body, JSON
// log lines without cookies, passwords or link tokens, and compressed JSON.
import { describe, it, expect } from 'vitest';
import express from 'express';
import request from 'supertest';
import { Writable } from 'node:stream';
import { pino } from 'pino';
import { anonymous, signInAs } from '../helpers/api';
import { Build } from '../../server/models';
import { requestLogger } from '../../server/logger';
import { errorHandler } from '../../server/middleware/errors';

/** A logger that keeps its JSON lines in memory. */
function capture() {
  const lines: Record<string, unknown>[] = [];
  const raw: string[] = [];
  const stream = new Writable({
    write(chunk, _enc, cb) {
      for (const l of String(chunk).split('\n').filter(Boolean)) {
        raw.push(l);
        lines.push(JSON.parse(l));
      }
      cb();
    },
  });
  return { log: pino({ level: 'info' }, stream), lines, raw };
}

describe('request ids', () => {
  it('every answer carries X-Request-Id, a fresh one per request', async () => {
    const a = await anonymous().get('/api/auth/me');
    const b = await anonymous().get('/api/auth/me');
    expect(a.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(b.headers['x-request-id']).not.toBe(a.headers['x-request-id']);
  });

  it('a 500 answer names the request id, the same as its header and its log line', async () => {
    const { log, lines } = capture();
    const app = express();
    app.use(requestLogger(log));
    app.get('/api/boom', () => {
      throw new Error('database exploded');
    });
    app.use(errorHandler);
    const res = await request(app).get('/api/boom');
    expect(res.status).toBe(500);
    expect(res.body.error.requestId).toBe(res.headers['x-request-id']);
    const line = lines.find((l) => (l.req as { id?: string })?.id === res.headers['x-request-id'])!;
    expect(line).toMatchObject({ level: 50, res: { statusCode: 500 } });
    expect(JSON.stringify(line.err)).toContain('database exploded');
  });
});

describe('log lines', () => {
  it('carry no cookie, password or link token', async () => {
    const { log, lines, raw } = capture();
    const app = express();
    app.use(requestLogger(log));
    app.use(express.json());
    app.post(
      '/api/auth/login',
      (_req, res) => void res.cookie('bayslate.sid', 'session-cookie-value').json({ ok: true }),
    );
    app.get('/api/invitations/:token', (_req, res) => void res.json({ ok: true }));
    app.get('/api/public/unsubscribe/:token', (_req, res) => void res.json({ ok: true }));
    await request(app)
      .post('/api/auth/login')
      .set('Cookie', 'bayslate.sid=secret-cookie-value')
      .set('Authorization', 'Basic c2VjcmV0')
      .send({ email: 'a@b.test', password: 'hunter2-password' });
    await request(app).get('/api/invitations/InviteTokenSecret12345?x=1');
    await request(app).get('/api/public/unsubscribe/abcdef0123456789.sigsigsig');
    const all = raw.join('\n');
    for (const secret of [
      'secret-cookie-value',
      'session-cookie-value',
      'hunter2-password',
      'c2VjcmV0',
      'InviteTokenSecret12345',
      'abcdef0123456789',
    ])
      expect(all).not.toContain(secret);
    expect(lines.map((l) => (l.req as { url: string }).url)).toEqual([
      '/api/auth/login',
      '/api/invitations/[token]',
      '/api/public/unsubscribe/[token]',
    ]);
    expect(
      lines.every((l) => typeof (l.req as { id: string }).id === 'string' && typeof l.responseTime === 'number'),
    ).toBe(true);
  });
});

describe('compression', () => {
  it('a large JSON answer goes out gzipped when the client accepts it', async () => {
    const owner = await signInAs('owner');
    const tern = (await Build.findOne({ where: { slug: 'project-tern' } }))!;
    const res = await owner.get(`/api/builds/${tern.id}/upgrades?pageSize=200`).set('Accept-Encoding', 'gzip');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(res.body.upgrades?.length ?? res.body.items?.length).toBeGreaterThan(5);
  });
});
