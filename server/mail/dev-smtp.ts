import { SMTPServer } from 'smtp-server';
import type { Db } from '../db/knex';
import { nowIso } from '../db/time';

export interface DevSmtp {
  port: number;
  close(): Promise<void>;
}

/**
 * The local mail fake: an SMTP server on loopback that keeps every message in the dev_outbox
 * table, which the app's outbox page shows. Never started in production.
 */
export async function startDevSmtp(db: Db, port: number): Promise<DevSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      // mailparser holds about 30 MB once loaded: loaded with the first message, not at start.
      import('mailparser')
        .then(({ simpleParser }) => simpleParser(stream))
        .then(async (mail) => {
          const to = Array.isArray(mail.to) ? mail.to.map((a) => a.text).join(', ') : (mail.to?.text ?? '');
          await db('dev_outbox').insert({
            from: mail.from?.text ?? '',
            to,
            subject: mail.subject ?? '(no subject)',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
            created_at: nowIso(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  const actualPort = typeof address === 'object' && address ? address.port : port;
  return {
    port: actualPort,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
