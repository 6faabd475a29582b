import type { Transporter } from 'nodemailer';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Files sent with the message (a delivery note as PDF). */
  attachments?: { filename: string; content: Buffer; contentType: string }[];
  /** The Message-ID header (`<id@domain>`): the outbox gives each message one, so a resend is the same message. */
  messageId?: string;
}

export interface Mailer {
  send(message: MailMessage): Promise<void>;
  close(): void;
}

/**
 * Sends through any SMTP URL: the local fake in development and tests, a real server in production.
 * nodemailer is loaded with the first message, not at start (it holds about 15 MB once loaded).
 */
export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  let transport: Promise<Transporter> | undefined;
  let closed = false;
  const open = () => {
    transport ??= import('nodemailer').then(({ default: nodemailer }) => nodemailer.createTransport(smtpUrl));
    transport.catch(() => {
      transport = undefined;
    });
    return transport;
  };
  return {
    async send(message) {
      const t = await open();
      await t.sendMail({ from, ...message });
      if (closed) t.close();
    },
    close() {
      closed = true;
      void transport?.then(
        (t) => t.close(),
        () => undefined,
      );
    },
  };
}
