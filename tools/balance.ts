// CLI: npm run balance -- FILE.json [--draws N] [--seed S] [--k K]
// Prints the balance result as JSON on stdout; exits 1 with a message on stderr for unreadable or invalid input.
import { readFileSync } from 'node:fs';
import { checkRunDocument, type BalanceSettings } from '../server/engine';
import { exitWithUsageOnHelp } from './cli-help';

exitWithUsageOnHelp(__filename);

function usage(message: string): never {
  process.stderr.write(`${message}\nusage: npm run balance -- FILE.json [--draws N] [--seed S] [--k K] [--indeterminate F]\n`);
  process.exit(2);
}

function main(argv: string[]): number {
  const settings: BalanceSettings = {};
  let file: string | undefined;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const next = () => argv[++i] ?? usage(`${a} needs a value`);
    const num = (v: string) => (Number.isFinite(Number(v)) ? Number(v) : usage(`${a} needs a number, got "${v}"`));
    if (a === '--draws') settings.draws = num(next());
    else if (a === '--seed') settings.seed = next();
    else if (a === '--k') settings.coverageFactor = num(next());
    else if (a === '--indeterminate') settings.indeterminateFraction = num(next());
    else if (a.startsWith('--')) usage(`unknown option ${a}`);
    else if (file) usage('give one run document');
    else file = a;
  }
  if (!file) usage('no run document given');
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    process.stderr.write(`cannot read ${file}: ${(e as Error).message}\n`);
    return 1;
  }
  let input: unknown;
  try {
    input = JSON.parse(text);
  } catch (e) {
    process.stderr.write(`${file} is not valid JSON: ${(e as Error).message}\n`);
    return 1;
  }
  if (typeof settings.seed === 'string' && /^\d+$/.test(settings.seed)) settings.seed = Number(settings.seed);
  const checked = checkRunDocument(input, settings);
  if (!checked.ok) {
    process.stderr.write(`${file} is not a valid run document:\n${checked.errors.map((e) => `  ${e.path || '(document)'}: ${e.message}`).join('\n')}\n`);
    return 1;
  }
  process.stdout.write(JSON.stringify(checked.result, null, 2) + '\n');
  return 0;
}

process.exitCode = main(process.argv.slice(2));
