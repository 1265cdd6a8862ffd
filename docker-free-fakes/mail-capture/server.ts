import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { randomUUID } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export type CapturedMail = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
};

export type MailCapture = {
  smtpPort: number;
  httpUrl: string;
  close(): Promise<void>;
};

/**
 * SMTP capture: accepts every message on loopback, saves it as .eml + .json
 * under `directory`, and lists them over HTTP (`GET /messages`,
 * `GET /messages/:id`, `DELETE /messages`) for the app's mailbox page and tests.
 */
export async function startMailCapture(opts: { smtpPort: number; httpPort: number; directory: string; host?: string }): Promise<MailCapture> {
  const host = opts.host ?? '127.0.0.1';
  fs.mkdirSync(opts.directory, { recursive: true });

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    disableReverseLookup: true,
    logger: false,
    onAuth: (_auth, _session, cb) => cb(null, { user: 'capture' }),
    onData(stream, session, cb) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', async () => {
        try {
          const raw = Buffer.concat(chunks);
          const parsed = await simpleParser(raw);
          const id = `${Date.now().toString(36)}-${randomUUID().slice(0, 8)}`;
          const record: CapturedMail = {
            id,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? String(session.envelope.mailFrom && session.envelope.mailFrom.address),
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '(no subject)',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
          };
          fs.writeFileSync(path.join(opts.directory, `${id}.eml`), raw);
          fs.writeFileSync(path.join(opts.directory, `${id}.json`), JSON.stringify(record, null, 2));
          cb();
        } catch (e) {
          cb(e as Error);
        }
      });
    },
  });

  const list = (): CapturedMail[] =>
    fs
      .readdirSync(opts.directory)
      .filter((f) => f.endsWith('.json'))
      .map((f) => JSON.parse(fs.readFileSync(path.join(opts.directory, f), 'utf8')) as CapturedMail)
      .sort((a, b) => b.receivedAt.localeCompare(a.receivedAt) || b.id.localeCompare(a.id));

  const web = http.createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://capture');
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { 'content-type': 'application/json' });
      res.end(JSON.stringify(body));
    };
    if (req.method === 'GET' && url.pathname === '/messages') {
      const to = url.searchParams.get('to')?.toLowerCase();
      return send(200, list().filter((m) => !to || m.to.some((r) => r.toLowerCase() === to)));
    }
    const one = /^\/messages\/([\w-]+)$/.exec(url.pathname);
    if (req.method === 'GET' && one) {
      const m = list().find((x) => x.id === one[1]);
      return m ? send(200, m) : send(404, { message: 'No such message' });
    }
    if (req.method === 'DELETE' && url.pathname === '/messages') {
      for (const f of fs.readdirSync(opts.directory)) fs.rmSync(path.join(opts.directory, f));
      return send(200, { deleted: true });
    }
    send(404, { message: 'Not found' });
  });

  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(opts.smtpPort, host, () => resolve());
  });
  await new Promise<void>((resolve, reject) => {
    web.once('error', reject);
    web.listen(opts.httpPort, host, () => resolve());
  });
  const smtpPort = (smtp.server.address() as AddressInfo).port;
  const httpPort = (web.address() as AddressInfo).port;
  return {
    smtpPort,
    httpUrl: `http://${host}:${httpPort}`,
    close: async () => {
      await new Promise<void>((r) => smtp.close(() => r()));
      await new Promise<void>((r) => web.close(() => r()));
    },
  };
}
