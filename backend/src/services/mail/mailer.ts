import nodemailer, { type Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  attachments?: Array<{ filename: string; content: Buffer; contentType?: string }>;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<{ messageId: string }>;
  close(): void;
}

/** nodemailer over SMTP: the local fake (plain, no TLS) or the relay at SMTP_URL. */
export function createMailer(smtpUrl: string, from: string): Mailer {
  const url = new URL(smtpUrl);
  const local = url.hostname === '127.0.0.1' || url.hostname === 'localhost';
  const transport: Transporter = nodemailer.createTransport(
    local
      ? { host: url.hostname, port: Number(url.port || 25), secure: false, ignoreTLS: true }
      : smtpUrl,
  );
  return {
    async send(mail) {
      const info = await transport.sendMail({ from, ...mail });
      return { messageId: String(info.messageId) };
    },
    close: () => transport.close(),
  };
}
