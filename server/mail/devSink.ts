/**
 * The local SMTP sink for development (HEADROOM_DEV_MAIL=1): an smtp-server on 127.0.0.1 that
 * accepts every message and stores it whole in the dev_mail table, where /api/dev/mail lists it.
 * Nothing leaves the machine.
 */
import { SMTPServer } from 'smtp-server';
import type { Db } from '../db/knex';

export interface DevSink {
  /** resolves with the address once the sink listens */
  ready: Promise<{ host: string; port: number }>;
  close: () => Promise<void>;
}

/** 25 MB: room for any summary PDF with headroom (a choice; a 200-segment summary is ~0.2 MB). */
const SIZE_LIMIT = 25 * 1024 * 1024;

export function startDevSink(db: Db, port: number): DevSink {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    size: SIZE_LIMIT,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        const head = raw.subarray(0, raw.indexOf('\r\n\r\n') > 0 ? raw.indexOf('\r\n\r\n') : raw.length).toString('utf8');
        const header = (name: string) =>
          head
            .match(new RegExp(`^${name}:\\s*(.*(?:\\r\\n[ \\t].*)*)`, 'im'))?.[1]
            ?.replace(/\r\n[ \t]/g, ' ')
            .trim() ?? null;
        db('dev_mail')
          .insert({
            envelope_from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            envelope_to: JSON.stringify(session.envelope.rcptTo.map((r) => r.address)),
            message_id: header('Message-ID'),
            subject: header('Subject') ?? '',
            raw,
          })
          .then(
            () => callback(),
            (err: Error) => callback(err),
          );
      });
    },
  });
  const ready = new Promise<{ host: string; port: number }>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      const address = server.server.address();
      resolve({ host: '127.0.0.1', port: typeof address === 'object' && address ? address.port : port });
    });
  });
  return {
    ready,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
