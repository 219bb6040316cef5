/**
 * Local stand-ins for the outside services Basted talks to in production: an S3-compatible
 * object store (s3rver) and an SMTP server whose captured messages can be read back, by tests
 * through a JSON API and by a person through a small web inbox.
 *
 * The Basted server never imports this file: it reaches these fakes only through
 * @aws-sdk/client-s3 and nodemailer, configured by environment, exactly as it would reach
 * real S3 and a real SMTP provider.
 */
import { mkdir, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import type { Server } from 'node:http';
import express from 'express';
import { simpleParser } from 'mailparser';
import S3rver from 's3rver';
import { SMTPServer } from 'smtp-server';

export type FakeServicesOptions = {
  host?: string;
  /** 0 picks a free port. */
  s3Port?: number;
  smtpPort?: number;
  inboxPort?: number;
  dataDir: string;
  buckets: string[];
};

export type CapturedMessage = {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  html: string | null;
};

export type FakeServices = {
  s3Endpoint: string;
  smtpPort: number;
  inboxUrl: string;
  stopSmtp(): Promise<void>;
  stop(): Promise<void>;
};

function listen(server: Server, port: number, host: string): Promise<number> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve((server.address() as AddressInfo).port));
  });
}

function escapeHtml(value: string): string {
  return value.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

/** Captured mail lives in one .eml file per message, so it survives a restart of the fakes. */
class MailStore {
  private cache = new Map<string, CapturedMessage>();
  private seq = 0;

  constructor(private readonly dir: string) {}

  async save(raw: Buffer): Promise<void> {
    this.seq += 1;
    const id = `${Date.now()}-${process.pid}-${this.seq}`;
    await writeFile(path.join(this.dir, `${id}.eml`), raw);
  }

  async list(): Promise<CapturedMessage[]> {
    const files = (await readdir(this.dir)).filter((f) => f.endsWith('.eml'));
    const messages: CapturedMessage[] = [];
    for (const file of files) {
      const id = file.slice(0, -'.eml'.length);
      let message = this.cache.get(id);
      if (!message) {
        const parsed = await simpleParser(await readFile(path.join(this.dir, file)));
        const to = Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : [];
        message = {
          id,
          from: parsed.from?.text ?? '',
          to: to.flatMap((a) => a.value.map((v) => (v.address ?? '').toLowerCase())),
          subject: parsed.subject ?? '',
          date: (parsed.date ?? new Date()).toISOString(),
          text: parsed.text ?? '',
          html: typeof parsed.html === 'string' ? parsed.html : null,
        };
        this.cache.set(id, message);
      }
      messages.push(message);
    }
    // Newest first; ids start with the capture time.
    return messages.sort((a, b) => b.id.localeCompare(a.id, 'en', { numeric: true }));
  }

  async clear(): Promise<void> {
    for (const file of await readdir(this.dir)) {
      if (file.endsWith('.eml')) await rm(path.join(this.dir, file), { force: true });
    }
    this.cache.clear();
  }
}

function inboxApp(store: MailStore): express.Express {
  const app = express();
  app.get('/health', (_req, res) => {
    res.json({ ok: true });
  });
  app.get('/api/messages', async (req, res) => {
    const to = typeof req.query.to === 'string' ? req.query.to.toLowerCase() : null;
    const subject = typeof req.query.subject === 'string' ? req.query.subject : null;
    const messages = (await store.list()).filter(
      (m) => (!to || m.to.includes(to)) && (!subject || m.subject.includes(subject)),
    );
    res.json({ messages });
  });
  app.get('/api/messages/:id', async (req, res) => {
    const message = (await store.list()).find((m) => m.id === req.params.id);
    if (!message) {
      res.status(404).json({ error: { code: 'not_found', message: 'No such message.' } });
      return;
    }
    res.json(message);
  });
  app.delete('/api/messages', async (_req, res) => {
    await store.clear();
    res.status(204).end();
  });
  app.get('/', async (_req, res) => {
    const rows = (await store.list())
      .map(
        (m) =>
          `<tr><td>${escapeHtml(new Date(m.date).toLocaleString('en-GB'))}</td>` +
          `<td>${escapeHtml(m.to.join(', '))}</td>` +
          `<td><a href="/messages/${encodeURIComponent(m.id)}">${escapeHtml(m.subject || '(no subject)')}</a></td></tr>`,
      )
      .join('');
    res.type('html').send(
      `<!doctype html><meta charset="utf-8"><title>Local inbox</title>` +
        `<style>body{font:15px system-ui;margin:2rem;color:#222}td,th{padding:.3rem .8rem;text-align:left;border-bottom:1px solid #ddd}</style>` +
        `<h1>Local inbox (development only)</h1><p>Every message the local SMTP server received. Nothing here leaves this machine.</p>` +
        `<table><tr><th>Received</th><th>To</th><th>Subject</th></tr>${rows || '<tr><td colspan="3">No messages yet.</td></tr>'}</table>`,
    );
  });
  app.get('/messages/:id', async (req, res) => {
    const m = (await store.list()).find((x) => x.id === req.params.id);
    if (!m) {
      res.status(404).type('text').send('No such message.');
      return;
    }
    res.type('html').send(
      `<!doctype html><meta charset="utf-8"><title>${escapeHtml(m.subject)}</title>` +
        `<style>body{font:15px system-ui;margin:2rem;color:#222}pre{white-space:pre-wrap}</style>` +
        `<p><a href="/">All messages</a></p><h1>${escapeHtml(m.subject)}</h1>` +
        `<p>From ${escapeHtml(m.from)} to ${escapeHtml(m.to.join(', '))}</p><pre>${escapeHtml(m.text)}</pre>`,
    );
  });
  return app;
}

export async function startFakeServices(options: FakeServicesOptions): Promise<FakeServices> {
  const host = options.host ?? '127.0.0.1';
  const s3Dir = path.join(options.dataDir, 's3');
  const mailDir = path.join(options.dataDir, 'mail');
  await mkdir(s3Dir, { recursive: true });
  await mkdir(mailDir, { recursive: true });

  const s3 = new S3rver({
    address: host,
    port: options.s3Port ?? 0,
    silent: true,
    directory: s3Dir,
    configureBuckets: options.buckets.map((name) => ({ name, configs: [] })),
  });
  const s3Address = await s3.run();

  const store = new MailStore(mailDir);
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        store.save(Buffer.concat(chunks)).then(() => callback(), callback);
      });
    },
  });
  const smtpPort = await listen(smtp.server as unknown as Server, options.smtpPort ?? 0, host);

  const inbox = inboxApp(store).listen(options.inboxPort ?? 0, host);
  await new Promise<void>((resolve, reject) => {
    inbox.once('listening', resolve);
    inbox.once('error', reject);
  });
  const inboxPort = (inbox.address() as AddressInfo).port;

  let smtpOpen = true;
  const stopSmtp = async () => {
    if (!smtpOpen) return;
    smtpOpen = false;
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
  };

  return {
    s3Endpoint: `http://${host}:${s3Address.port}`,
    smtpPort,
    inboxUrl: `http://${host}:${inboxPort}`,
    stopSmtp,
    async stop() {
      await stopSmtp();
      await new Promise<void>((resolve) => inbox.close(() => resolve()));
      await s3.close();
    },
  };
}
