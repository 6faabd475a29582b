import nodemailer, { type Transporter } from 'nodemailer';

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

/** Sends through any SMTP URL: the local fake in development and tests, a real server in production. */
export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const transport: Transporter = nodemailer.createTransport(smtpUrl);
  return {
    async send(message) {
      await transport.sendMail({ from, ...message });
    },
    close() {
      transport.close();
    },
  };
}
