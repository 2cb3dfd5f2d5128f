import { randomUUID } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface MailboxMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string;
  subject: string;
  text: string;
  html?: string;
}

export interface Mailbox {
  /** Every message received so far, oldest first. */
  messages(): Promise<MailboxMessage[]>;
}

export interface EmbeddedSmtp extends Mailbox {
  url: string;
  close(): Promise<void>;
}

function addressText(value: AddressObject | AddressObject[] | undefined): string {
  if (!value) return '';
  return (Array.isArray(value) ? value : [value]).map((a) => a.text).join(', ');
}

/**
 * A local SMTP stand-in: accepts any message on loopback and keeps it as JSON under `directory`
 * so the dev inbox survives restarts. Not for production: no auth, no relay.
 */
export async function startEmbeddedSmtp(opts: { directory: string; port?: number }): Promise<EmbeddedSmtp> {
  await fs.mkdir(opts.directory, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          const message: MailboxMessage = {
            id: randomUUID(),
            receivedAt: new Date().toISOString(),
            from: addressText(parsed.from),
            to: addressText(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : undefined,
          };
          const file = `${message.receivedAt.replace(/[:.]/g, '-')}-${message.id}.json`;
          await fs.writeFile(path.join(opts.directory, file), JSON.stringify(message, null, 2));
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    url: `smtp://127.0.0.1:${port}`,
    async messages() {
      const names = (await fs.readdir(opts.directory)).filter((n) => n.endsWith('.json')).sort();
      const all = await Promise.all(
        names.map(
          async (n) => JSON.parse(await fs.readFile(path.join(opts.directory, n), 'utf8')) as MailboxMessage,
        ),
      );
      return all;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
