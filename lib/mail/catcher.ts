import fs from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

/**
 * The local mail catcher: an SMTP server on loopback that accepts every message and keeps it as
 * one JSON file per message in `dir`. It stands in for a hosted mail service in local mode and in
 * tests; production points SMTP_URL at a real server instead.
 */
export function startMailCatcher(opts: { port: number; dir: string; host?: string }) {
  fs.mkdirSync(opts.dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          const id = `${Date.now()}-${Math.random().toString(36).slice(2, 10)}`;
          const to = session.envelope.rcptTo.map((r) => r.address);
          const record = {
            id,
            receivedAt: new Date().toISOString(),
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to,
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : '',
          };
          const file = path.join(opts.dir, `${id}.json`);
          // Write then rename so readers never see half a message.
          fs.writeFileSync(`${file}.tmp`, JSON.stringify(record));
          fs.renameSync(`${file}.tmp`, file);
          callback();
        })
        .catch((e: Error) => callback(e));
    },
  });
  return new Promise<SMTPServer>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, opts.host ?? '127.0.0.1', () => resolve(server));
  });
}
