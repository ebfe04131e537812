import { existsSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Client, type TestApp, signedIn, startTestApp } from '../support/api';

let t: TestApp;
let engineer: Client;
beforeAll(async () => {
  t = await startTestApp();
  engineer = await signedIn(t.app, 'engineer');
});
afterAll(() => t.stop());

// Smallest valid PNG: 1×1 transparent pixel (signature 89 50 4E 47 per the PNG specification).
const PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=', 'base64');

describe('site-plan upload (target S6)', () => {
  it('stores a real image under a generated name outside the web root and serves it back', async () => {
    const res = await engineer.agent.post('/api/locations/1/site-plan').set('x-csrf-token', engineer.token).attach('file', PNG, 'plan.png');
    expect(res.status).toBe(200);
    expect(res.body.sitePlanFile).toMatch(/^[0-9a-f-]{36}\.png$/);
    expect(existsSync(path.join(t.config.dataDir, 'uploads', 'site-plans', res.body.sitePlanFile))).toBe(true);
    const back = await engineer.get('/api/locations/1/site-plan');
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/png');
    expect(Buffer.compare(back.body, PNG)).toBe(0);
  });

  it('rejects a file whose content is not an image, whatever its name', async () => {
    const res = await engineer.agent.post('/api/locations/1/site-plan').set('x-csrf-token', engineer.token).attach('file', Buffer.from('<script>alert(1)</script>'), { filename: 'plan.png', contentType: 'image/png' });
    expect(res.status).toBe(415);
    expect(res.body.error.field).toBe('file');
  });

  it('rejects an oversize file', async () => {
    const big = Buffer.concat([PNG, Buffer.alloc(11 * 1024 * 1024)]);
    const res = await engineer.agent.post('/api/locations/1/site-plan').set('x-csrf-token', engineer.token).attach('file', big, 'big.png');
    expect(res.status).toBe(413);
  });

  it('requires a file', async () => {
    const res = await engineer.post('/api/locations/1/site-plan', {});
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('file');
  });
});
