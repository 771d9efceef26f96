// Browser mode / test bridge: serves the built renderer and the operation table over HTTP on
// 127.0.0.1 only. The desktop app uses IPC instead; this exists for end-to-end tests in a real
// browser without the Electron binary, and for running the UI in a local browser.
// Requests must carry our own Host header (defeats DNS rebinding) and JSON content type
// (a cross-site form cannot send it without a CORS preflight, which we never grant).
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { readFile } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { callOperation, serializeError, type Handlers } from '../api/gate.ts';
import { operations, type Operations } from '../api/table.ts';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.json': 'application/json',
  '.woff2': 'font/woff2',
};

const CSP = "default-src 'none'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data: blob:; connect-src 'self'; base-uri 'none'; form-action 'none'; object-src 'none'";
const MAX_BODY = 80 * 1024 * 1024;

export interface Bridge {
  server: Server;
  url: string;
  close(): Promise<void>;
}

export async function startBridge(opts: { staticDir: string; handlers: Partial<Handlers<Operations>>; port?: number }): Promise<Bridge> {
  const root = resolve(opts.staticDir);
  const jobs = new Map<string, AbortController>();
  const listeners = new Set<ServerResponse>();
  let host = '';

  const server = createServer((req, res) => {
    void handle(req, res).catch((e) => {
      if (!res.headersSent) res.writeHead(500, { 'content-type': 'text/plain' });
      res.end(String((e as Error).message));
    });
  });

  async function readBody(req: IncomingMessage): Promise<unknown> {
    const chunks: Buffer[] = [];
    let size = 0;
    for await (const c of req) {
      size += (c as Buffer).length;
      if (size > MAX_BODY) throw new Error('request too large');
      chunks.push(c as Buffer);
    }
    return JSON.parse(Buffer.concat(chunks).toString('utf8'));
  }

  function json(res: ServerResponse, status: number, body: unknown): void {
    res.writeHead(status, { 'content-type': 'application/json', 'cache-control': 'no-store' });
    res.end(JSON.stringify(body, (_k, v) => (ArrayBuffer.isView(v) && !(v instanceof DataView) ? Array.from(v as Float64Array) : v)));
  }

  async function handle(req: IncomingMessage, res: ServerResponse): Promise<void> {
    if (req.headers.host !== host) {
      res.writeHead(421, { 'content-type': 'text/plain' });
      res.end('wrong host');
      return;
    }
    const url = new URL(req.url ?? '/', `http://${host}`);
    if (url.pathname.startsWith('/api/')) {
      if (url.pathname === '/api/progress' && req.method === 'GET') {
        res.writeHead(200, { 'content-type': 'text/event-stream', 'cache-control': 'no-store', connection: 'keep-alive' });
        res.write(':ok\n\n');
        listeners.add(res);
        req.on('close', () => listeners.delete(res));
        return;
      }
      if (req.method !== 'POST' || !(req.headers['content-type'] ?? '').startsWith('application/json')) {
        json(res, 415, { ok: false, error: { code: 'forbidden', message: 'POST application/json only' } });
        return;
      }
      const body = (await readBody(req)) as { name?: unknown; args?: unknown; jobId?: unknown };
      if (url.pathname === '/api/cancel') {
        if (typeof body.jobId === 'string') jobs.get(body.jobId)?.abort();
        json(res, 200, { ok: true, value: null });
        return;
      }
      if (url.pathname !== '/api/call') {
        json(res, 404, { ok: false, error: { code: 'unknown-operation', message: 'no such endpoint' } });
        return;
      }
      const jobId = typeof body.jobId === 'string' && body.jobId.length <= 64 ? body.jobId : undefined;
      const controller = new AbortController();
      if (jobId) jobs.set(jobId, controller);
      try {
        const value = await callOperation(operations, opts.handlers, body.name, body.args, {
          signal: controller.signal,
          progress: (p) => {
            if (!jobId) return;
            const line = `data: ${JSON.stringify({ jobId, fraction: p.fraction, message: p.message })}\n\n`;
            for (const l of listeners) l.write(line);
          },
        });
        json(res, 200, { ok: true, value });
      } catch (e) {
        json(res, 200, { ok: false, error: serializeError(e) });
      } finally {
        if (jobId) jobs.delete(jobId);
      }
      return;
    }
    if (req.method !== 'GET') {
      res.writeHead(405);
      res.end();
      return;
    }
    const rel = url.pathname === '/' ? 'index.html' : decodeURIComponent(url.pathname.slice(1));
    const file = normalize(join(root, rel));
    if (!file.startsWith(root + sep)) {
      res.writeHead(403);
      res.end();
      return;
    }
    try {
      const data = await readFile(file);
      res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream', 'content-security-policy': CSP, 'x-content-type-options': 'nosniff' });
      res.end(data);
    } catch {
      res.writeHead(404, { 'content-type': 'text/plain' });
      res.end('not found');
    }
  }

  await new Promise<void>((ok) => server.listen(opts.port ?? 0, '127.0.0.1', ok));
  const addr = server.address();
  if (!addr || typeof addr === 'string') throw new Error('bridge: no address');
  host = `127.0.0.1:${addr.port}`;
  return {
    server,
    url: `http://${host}/`,
    close: () =>
      new Promise<void>((ok) => {
        for (const l of listeners) l.end();
        server.close(() => ok());
        server.closeAllConnections();
      }),
  };
}
