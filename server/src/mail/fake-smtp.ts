import { createHash } from 'node:crypto';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import pg from 'pg';

export interface FakeSmtp {
  port: number;
  url: string;
  stop(): Promise<void>;
}

/**
 * The local fake mail service: a real SMTP server on loopback that accepts every message, parses it
 * and stores it in the fake_mailbox table, where the admin's outbox page and the tests read it.
 * Never used when SMTP_URL points at a real provider.
 */
export async function startFakeSmtp(databaseUrl: string, port = 0): Promise<FakeSmtp> {
  // Enough connections for the worker's concurrent sends (MAIL_CONCURRENCY, bench/mail.ts).
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 10 });
  pool.on('error', () => undefined);
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 30 * 1024 * 1024,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const raw = Buffer.concat(chunks);
        simpleParser(raw)
          .then((mail) =>
            pool.query(
              `INSERT INTO fake_mailbox (envelope_from, envelope_to, subject, message_id, text_body, html_body, attachments, raw)
               VALUES ($1, $2, $3, $4, $5, $6, $7, $8)`,
              [
                session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
                session.envelope.rcptTo.map((r) => r.address),
                mail.subject ?? null,
                mail.messageId ?? null,
                mail.text ?? null,
                typeof mail.html === 'string' ? mail.html : null,
                JSON.stringify(
                  mail.attachments.map((a) => ({
                    filename: a.filename,
                    contentType: a.contentType,
                    size: a.size,
                    sha256: createHash('sha256').update(a.content).digest('hex'),
                  })),
                ),
                raw,
              ],
            ),
          )
          .then(
            () => callback(),
            (err) => callback(err),
          );
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  const actual = (server.server.address() as { port: number }).port;
  return {
    port: actual,
    url: `smtp://127.0.0.1:${actual}?ignoreTLS=true`,
    async stop() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await pool.end();
    },
  };
}
