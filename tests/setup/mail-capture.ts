import { simpleParser, type ParsedMail } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { createSmtpMailer, type Mailer } from '../../server/mail/mailer';

export interface CapturedMail {
  to: string;
  subject: string;
  text: string;
  html: string | false;
  attachments: { filename: string; contentType: string; content: Buffer }[];
  /** The Message-ID header as sent (the outbox row's message_id). */
  messageId: string;
}

/** An in-process SMTP server on port 0: the app's real mailer sends to it and tests read what came. */
export async function startMailCapture(): Promise<{ mailer: Mailer; port: number; messages: CapturedMail[]; waitFor: (to: string) => Promise<CapturedMail>; close: () => Promise<void> }> {
  const messages: CapturedMail[] = [];
  const waiters: { to: string; resolve: (m: CapturedMail) => void }[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail: ParsedMail) => {
          const to = Array.isArray(mail.to) ? mail.to.map((a) => a.text).join(', ') : (mail.to?.text ?? '');
          const m: CapturedMail = {
            to,
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: mail.html ?? false,
            attachments: mail.attachments.map((a) => ({ filename: a.filename ?? '', contentType: a.contentType, content: a.content })),
            messageId: mail.messageId ? `<${mail.messageId.replace(/^<|>$/g, '')}>` : '',
          };
          messages.push(m);
          for (const w of waiters.filter((x) => to.includes(x.to))) {
            waiters.splice(waiters.indexOf(w), 1);
            w.resolve(m);
          }
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : 0;
  const mailer = createSmtpMailer(`smtp://127.0.0.1:${port}`, 'Ridgeload <no-reply@ridgeload.test>');
  return {
    mailer,
    port,
    messages,
    waitFor(to: string) {
      const found = messages.find((m) => m.to.includes(to));
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        waiters.push({ to, resolve });
        setTimeout(() => reject(new Error(`no e-mail to ${to} within 5 s`)), 5000).unref();
      });
    },
    close: async () => {
      mailer.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
