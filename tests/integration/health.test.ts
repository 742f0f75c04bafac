import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../support/test-app.ts';

describe('GET /api/health', () => {
  const testApp = createTestApp();
  afterAll(() => testApp.close());

  it('when every service is up, then it reports ok for database, queue, storage and mail, with the version', async () => {
    const res = await request(testApp.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      health: {
        status: 'ok',
        version: expect.stringMatching(/^\d+\.\d+\.\d+/),
        services: {
          database: { status: 'ok' }, queue: { status: 'ok' }, storage: { status: 'ok' }, mail: { status: 'ok' },
        },
      },
    });
  });

  it('when the mail relay is unreachable, then mail is down with a reason and the status is degraded', async () => {
    const broken = createTestApp({ SMTP_PORT: '1' });
    try {
      const res = await request(broken.app).get('/api/health');
      expect(res.status).toBe(503);
      expect(res.body.health.status).toBe('degraded');
      expect(res.body.health.services.mail.status).toBe('down');
      expect(res.body.health.services.mail.reason).toMatch(/\S/);
      expect(res.body.health.services.database.status).toBe('ok');
    } finally {
      await broken.close();
    }
  });
});

describe('security headers', () => {
  const testApp = createTestApp();
  afterAll(() => testApp.close());

  it('when any API route answers, then the CSP allows only the app\'s own origin', async () => {
    const res = await request(testApp.app).get('/api/health');
    const csp = res.headers['content-security-policy'];
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).not.toMatch(/https?:/);
  });

  it('when a route does not exist, then the JSON error names the method and path', async () => {
    const res = await request(testApp.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe('No API route for GET /no-such-thing.');
  });
});
