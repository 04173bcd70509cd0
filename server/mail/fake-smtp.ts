import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import { MailMessage } from '../models';

export interface FakeSmtp {
  url: string;
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

function addresses(field: AddressObject | AddressObject[] | undefined): string {
  if (!field) return '';
  const list = Array.isArray(field) ? field : [field];
  return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean).join(', ');
}

/**
 * A real SMTP server on loopback that keeps what it receives in mail_messages, so development and tests send
 * mail through the same nodemailer SMTP path as production and admins can read it on the outbox page.
 */
export async function startFakeSmtp(): Promise<FakeSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: MAX_MESSAGE_BYTES,
    banner: 'Holdfire local mail catcher',
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then(async (parsed) => {
          await MailMessage.create({
            messageId: parsed.messageId ?? null,
            from: addresses(parsed.from),
            to: addresses(parsed.to),
            subject: parsed.subject ?? '(no subject)',
            text: parsed.text ?? '',
            sentAt: parsed.date ?? new Date(),
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const address = server.server.address();
  if (!address || typeof address === 'string') throw new Error('local SMTP server has no port');
  return {
    url: `smtp://127.0.0.1:${address.port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
