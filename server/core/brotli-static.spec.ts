import express from 'express';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { brotliStatic } from './brotli-static';

describe('brotliStatic', () => {
  const dir = mkdtempSync(join(tmpdir(), 'qwell-brotli-'));
  // Repetitive, like bundled JS: brotli packs it far below its size.
  const script = 'export const reading = { time: 0, pressure: 101325 };\n'.repeat(2000);
  writeFileSync(join(dir, 'chunk-ABC.js'), script);
  writeFileSync(join(dir, 'index.html'), '<html></html>');
  const app = express();
  app.use(brotliStatic(dir, 3600));
  app.use(express.static(dir, { index: false }));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  async function whenPacked(): Promise<request.Response> {
    for (let i = 0; i < 200; i++) {
      const res = await request(app).get('/chunk-ABC.js').set('Accept-Encoding', 'gzip, br');
      if (res.headers['content-encoding'] === 'br') return res;
      await new Promise((r) => setTimeout(r, 50));
    }
    throw new Error('the file was never served brotli-compressed');
  }

  it('serves a built script brotli-compressed, byte-identical once decompressed', async () => {
    const res = await whenPacked();
    expect(res.headers['content-type']).toBe('text/javascript; charset=utf-8');
    expect(res.headers['vary']).toBe('Accept-Encoding');
    // What went over the wire (supertest decompresses the body itself).
    expect(Number(res.headers['content-length'])).toBeLessThan(script.length / 20);
    expect(res.text).toBe(script);
  });

  it('leaves a browser without brotli, and files it does not pack, to the ordinary handler', async () => {
    await whenPacked();
    const plain = await request(app).get('/chunk-ABC.js').set('Accept-Encoding', 'gzip');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text).toBe(script);
    const html = await request(app).get('/index.html').set('Accept-Encoding', 'br');
    expect(html.headers['content-encoding']).toBeUndefined();
    expect(html.text).toBe('<html></html>');
  });
});
