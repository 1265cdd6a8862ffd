import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import type { AddressInfo } from 'node:net';

export type RegisteredIdentifier = {
  doi: string;
  url: string;
  metadata: Record<string, unknown>;
  state: 'findable' | 'registered';
  createdAt: string;
  updatedAt: string;
};

export type IdentifierRegistryFake = { url: string; close(): Promise<void> };

/**
 * A local identifier registration agency: accepts registrations over HTTP
 * and resolves them, with the records kept in one JSON file.
 *   PUT  /identifiers/<doi>   { url, metadata, state? }  (Basic auth)  → 201 or 200
 *   GET  /identifiers/<doi>   → the record (case-insensitive lookup)
 *   GET  /resolve/<doi>       → 302 to the registered URL
 * Cohesia's own protocol, kept small; a real agency gets its own adapter.
 */
export async function startIdentifierRegistry(opts: { port: number; file: string; user: string; password: string; host?: string }): Promise<IdentifierRegistryFake> {
  const host = opts.host ?? '127.0.0.1';
  fs.mkdirSync(path.dirname(opts.file), { recursive: true });
  const load = (): Record<string, RegisteredIdentifier> => (fs.existsSync(opts.file) ? JSON.parse(fs.readFileSync(opts.file, 'utf8')) : {});
  const save = (all: Record<string, RegisteredIdentifier>) => fs.writeFileSync(opts.file, JSON.stringify(all, null, 2));
  const expectedAuth = `Basic ${Buffer.from(`${opts.user}:${opts.password}`).toString('base64')}`;

  const server = http.createServer(async (req, res) => {
    const send = (status: number, body: unknown, headers: Record<string, string> = {}) => {
      res.writeHead(status, { 'content-type': 'application/json', ...headers });
      res.end(JSON.stringify(body));
    };
    const url = new URL(req.url ?? '/', 'http://registry');
    const m = /^\/(identifiers|resolve)\/(10\.\d{4,9}\/.+)$/.exec(decodeURIComponent(url.pathname));
    if (!m) return send(404, { error: 'not_found' });
    const key = m[2].toUpperCase();
    const all = load();
    if (req.method === 'GET' && m[1] === 'resolve') {
      const rec = all[key];
      return rec ? send(302, { location: rec.url }, { location: rec.url }) : send(404, { error: 'unknown_identifier' });
    }
    if (req.method === 'GET') return all[key] ? send(200, all[key]) : send(404, { error: 'unknown_identifier' });
    if (req.method === 'PUT') {
      if (req.headers.authorization !== expectedAuth) return send(401, { error: 'bad_credentials' });
      const chunks: Buffer[] = [];
      for await (const c of req) chunks.push(c as Buffer);
      let body: { url?: string; metadata?: Record<string, unknown>; state?: string };
      try {
        body = JSON.parse(Buffer.concat(chunks).toString('utf8'));
      } catch {
        return send(400, { error: 'invalid_json' });
      }
      if (!body.url || !/^https?:\/\//.test(body.url)) return send(422, { error: 'url_required' });
      const now = new Date().toISOString();
      const existing = all[key];
      all[key] = {
        doi: m[2],
        url: body.url,
        metadata: body.metadata ?? {},
        state: body.state === 'registered' ? 'registered' : 'findable',
        createdAt: existing?.createdAt ?? now,
        updatedAt: now,
      };
      save(all);
      return send(existing ? 200 : 201, all[key]);
    }
    send(405, { error: 'method_not_allowed' });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  return { url: `http://${host}:${port}`, close: () => new Promise((r) => server.close(() => r())) };
}
