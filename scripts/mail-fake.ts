/**
 * The local mail fake for development and tests: an SMTP server on 127.0.0.1 that accepts every
 * message and keeps it in the mail_messages table, where admins read it on the mailbox page.
 */
import { SMTPServer } from 'smtp-server';
import knexFactory from 'knex';
import { knexConfig } from '../knexfile';
import { parseMail } from '../lib/server/mail-parse';

const port = Number(process.env.SMTP_PORT ?? 2525);
const knex = knexFactory(knexConfig());

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  banner: 'Tauforge local mail fake',
  size: 10 * 1024 * 1024,
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on('data', (c: Buffer) => chunks.push(c));
    stream.on('end', () => {
      const raw = Buffer.concat(chunks);
      const parsed = parseMail(raw.toString('utf8'));
      const from = session.envelope.mailFrom ? session.envelope.mailFrom.address : '';
      const to = session.envelope.rcptTo.map((r) => r.address).join(', ');
      knex('mail_messages')
        .insert({ mail_from: from, mail_to: to, subject: parsed.subject.slice(0, 500), body_text: parsed.text, raw })
        .then(() => callback())
        .catch((err: Error) => callback(err));
    });
  },
});

server.on('error', (err) => console.error(`mail fake: ${err.message}`));
server.listen(port, '127.0.0.1');

async function stop() {
  server.close(() => undefined);
  await knex.destroy();
  process.exit(0);
}
process.on('SIGTERM', () => void stop());
process.on('SIGINT', () => void stop());
