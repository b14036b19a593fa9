import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';
import type { Db } from '../db/client';
import { insertDevMail } from './dev-mail.repo';

export interface DevMailServer {
  port: number;
  close: () => Promise<void>;
}

const addresses = (value: AddressObject | AddressObject[] | undefined) =>
  (Array.isArray(value) ? value : value ? [value] : []).map((a) => a.text).join(', ');

/**
 * The local mail server for development and tests: an SMTP server on 127.0.0.1 that accepts
 * every message, parses it and stores it in dev_mail_messages (shown at /dev/mail). It answers
 * the client only after the row is written, so a message is readable once sendMail resolves.
 */
export function startDevMailServer(db: Db, port = 0): Promise<DevMailServer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Syconium development mailbox',
    size: 5 * 1024 * 1024,
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream).then((parsed) => {
        insertDevMail(db, {
          messageId: parsed.messageId ?? null,
          from: addresses(parsed.from),
          to: addresses(parsed.to),
          subject: parsed.subject ?? '',
          text: parsed.text ?? null,
          html: typeof parsed.html === 'string' ? parsed.html : null,
        });
        callback();
      }, callback);
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      server.on('error', (err) => console.error('development mail server:', err));
      resolve({
        port: (server.server.address() as AddressInfo).port,
        close: () => new Promise((done) => server.close(() => done())),
      });
    });
  });
}
