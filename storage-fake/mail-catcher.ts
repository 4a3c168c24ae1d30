/**
 * The local mail catcher: a thin wrapper over smtp-server 3.21.6 that accepts
 * every message on loopback and keeps it as a .eml file (plus a small JSON
 * index entry) in a folder, so the app can show caught messages on its outbox
 * page and tests can read them. Parsed with mailparser.
 */
import { mkdirSync, readdirSync, readFileSync, writeFileSync, renameSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export interface CaughtMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

export interface MailCatcher {
  url: string;
  directory: string;
  close(): Promise<void>;
}

export async function startMailCatcher(opts: { directory: string; port?: number }): Promise<MailCatcher> {
  mkdirSync(opts.directory, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    banner: 'Tangentry mail catcher',
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', async () => {
        try {
          const raw = Buffer.concat(chunks);
          const parsed = await simpleParser(raw);
          const id = `${Date.now().toString().padStart(15, '0')}-${randomUUID()}`;
          const message: CaughtMessage = {
            id,
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : null,
          };
          writeFileSync(join(opts.directory, `${id}.eml`), raw);
          // write-then-rename so a reader never sees half a message
          const tmp = join(opts.directory, `.${id}.json.tmp`);
          writeFileSync(tmp, JSON.stringify(message));
          renameSync(tmp, join(opts.directory, `${id}.json`));
          callback();
        } catch (err) {
          callback(err as Error);
        }
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve());
  });
  const addr = server.server.address();
  const port = typeof addr === 'object' && addr ? addr.port : 0;
  return {
    url: `smtp://127.0.0.1:${port}`,
    directory: opts.directory,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** Caught messages, newest first. */
export function readCaughtMessages(directory: string): CaughtMessage[] {
  let names: string[];
  try {
    names = readdirSync(directory).filter((n) => n.endsWith('.json') && !n.startsWith('.'));
  } catch {
    return [];
  }
  return names
    .sort()
    .reverse()
    .map((n) => JSON.parse(readFileSync(join(directory, n), 'utf8')) as CaughtMessage);
}
