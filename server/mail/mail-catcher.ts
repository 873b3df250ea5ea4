import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';

export interface CaughtMail {
  file: string;
  from: string;
  to: string[];
}

/**
 * A local SMTP server on loopback that keeps every message as an .eml file: development and tests
 * use it in place of a real mail service.
 */
export function startMailCatcher(dir: string, port: number, host = '127.0.0.1'): Promise<SMTPServer> {
  mkdirSync(dir, { recursive: true });
  let counter = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('end', () => {
        const name = `${new Date().toISOString().replace(/[:.]/g, '-')}-${process.pid}-${++counter}.eml`;
        const envelope = `X-Qwell-Envelope-To: ${session.envelope.rcptTo.map((r) => r.address).join(', ')}\r\n`;
        writeFileSync(join(dir, name), Buffer.concat([Buffer.from(envelope), ...chunks]));
        callback();
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve(server));
  });
}
