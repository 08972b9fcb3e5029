import http from 'node:http';
import { randomUUID } from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';

/**
 * A local SMTP sink for development and tests: accepts every message, keeps the latest in memory
 * and serves them as JSON on a small HTTP port the app reads in development.
 */
export interface MailSink {
  smtpUrl: string;
  apiUrl: string;
  stop(): Promise<void>;
}

interface Captured {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

const KEEP = 500;

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  if (!a) return [];
  return (Array.isArray(a) ? a : [a]).flatMap((x) => x.value.map((v) => v.address ?? v.name ?? ''));
}

export async function startMailSink(options: { smtpPort: number; apiPort: number }): Promise<MailSink> {
  const messages: Captured[] = [];
  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) => {
          messages.unshift({
            id: randomUUID(),
            receivedAt: new Date().toISOString(),
            from: addresses(mail.from)[0] ?? '',
            to: addresses(mail.to),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
          });
          messages.length = Math.min(messages.length, KEEP);
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(options.smtpPort, '127.0.0.1', () => resolve());
  });
  const smtpPort = (smtp.server.address() as { port: number }).port;

  const api = http.createServer((req, res) => {
    if (req.method === 'GET' && req.url === '/messages') {
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify(messages));
    } else if (req.method === 'DELETE' && req.url === '/messages') {
      messages.length = 0;
      res.writeHead(204).end();
    } else res.writeHead(404).end();
  });
  await new Promise<void>((resolve, reject) => {
    api.once('error', reject);
    api.listen(options.apiPort, '127.0.0.1', () => resolve());
  });
  const apiPort = (api.address() as { port: number }).port;

  return {
    smtpUrl: `smtp://127.0.0.1:${smtpPort}`,
    apiUrl: `http://127.0.0.1:${apiPort}`,
    stop: async () => {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      await new Promise<void>((resolve) => {
        api.close(() => resolve());
        api.closeAllConnections();
      });
    },
  };
}
