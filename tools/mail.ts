// Lists the mail the loopback SMTP catcher kept (npm start runs it): `npm run mail [-- N]` shows the
// last N messages (default 10) with recipients and subject, and the body of the newest.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { dataDir } from '../server/config';
import { exitWithUsageOnHelp } from './cli-help';

exitWithUsageOnHelp(__filename);

const dir = process.env['QWELL_MAIL_DIR'] ?? join(dataDir, 'mail');
const count = Number(process.argv[2] ?? 10);
if (!existsSync(dir)) {
  console.log(`No mail yet: ${dir} does not exist (start Qwell with npm start).`);
  process.exit(0);
}
const files = readdirSync(dir).filter((f) => f.endsWith('.eml')).sort().slice(-count);
const header = (text: string, name: string) => new RegExp(`^${name}: (.*)$`, 'mi').exec(text)?.[1]?.trim() ?? '';
for (const file of files) {
  const text = readFileSync(join(dir, file), 'utf8');
  console.log(`${file}\n  to:      ${header(text, 'X-Qwell-Envelope-To')}\n  subject: ${header(text, 'Subject')}`);
}
const newest = files.at(-1);
if (newest) {
  const text = readFileSync(join(dir, newest), 'utf8');
  console.log(`\n--- ${newest} ---\n${text.split(/\r?\n\r?\n/).slice(1).join('\n\n')}`);
} else {
  console.log('No messages.');
}
