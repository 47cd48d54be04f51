import type { AddressInfo } from 'node:net';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export type ReceivedMail = { id: number; to: string[]; from: string; subject: string; text: string; attachments: { filename: string; contentType: string; size: number }[]; receivedAt: string };

/**
 * A fake SMTP server on loopback for development and tests: it accepts any message and keeps the last
 * 200 in memory, so invitations and reset links can be read on a developer-only page.
 */
export type DevInbox = { port: number; messages: () => ReceivedMail[]; clear: () => void; close: () => Promise<void> };

export async function startDevInbox(port = 0): Promise<DevInbox> {
  const received: ReceivedMail[] = [];
  let nextId = 1;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Troughline development inbox',
    onData(stream, _session, callback) {
      simpleParser(stream).then(
        (parsed) => {
          const to = (Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : []).flatMap((group) => group.value.map((a) => a.address ?? ''));
          received.unshift({
            id: nextId++,
            to,
            from: parsed.from?.text ?? '',
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            attachments: parsed.attachments.map((a) => ({ filename: a.filename ?? 'attachment', contentType: a.contentType, size: a.size })),
            receivedAt: new Date().toISOString(),
          });
          received.length = Math.min(received.length, 200);
          callback();
        },
        (error: Error) => callback(error),
      );
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  return {
    port: (server.server.address() as AddressInfo).port,
    messages: () => [...received],
    clear: () => void (received.length = 0),
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
