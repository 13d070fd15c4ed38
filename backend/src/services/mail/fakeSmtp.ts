import { createHash } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { MailMessage } from '../../models';

function addresses(a: AddressObject | AddressObject[] | undefined): string[] {
  if (!a) return [];
  return (Array.isArray(a) ? a : [a]).flatMap((o) => o.value.map((v) => v.address ?? '').filter(Boolean));
}

export interface FakeSmtp {
  port: number;
  url: string;
  close(): Promise<void>;
}

/**
 * The local mail fake: a real SMTP server on 127.0.0.1 (smtp-server) that accepts every message and
 * stores it in mail_messages, so the admin outbox shows exactly what would have been sent.
 */
export async function startFakeSmtp(opts: { port?: number; log?: (m: string) => void } = {}): Promise<FakeSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Ringfence local mail capture',
    size: 50 * 1024 * 1024,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((mail) =>
            MailMessage.create({
              from: addresses(mail.from)[0] ?? (session.envelope.mailFrom ? session.envelope.mailFrom.address : ''),
              to: session.envelope.rcptTo.map((r) => r.address),
              subject: mail.subject ?? '',
              text: mail.text ?? '',
              attachments: mail.attachments.map((a) => ({
                filename: a.filename ?? 'attachment',
                contentType: a.contentType,
                size: a.size,
                checksum: createHash('sha256').update(a.content).digest('hex'),
              })),
              raw,
            }),
          )
          .then(() => callback())
          .catch((err: Error) => {
            opts.log?.(`mail capture failed: ${err.message}`);
            callback(err);
          });
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, '127.0.0.1', () => resolve());
  });
  const port = (server.server.address() as AddressInfo).port;
  return {
    port,
    url: `smtp://127.0.0.1:${port}`,
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}
