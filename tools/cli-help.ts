import { readFileSync } from 'node:fs';

/** The comment block a script starts with: what it does and how to call it. */
export function usageOf(file: string): string {
  const lines: string[] = [];
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    if (!line.startsWith('//')) break;
    lines.push(line.replace(/^\/\/ ?/, ''));
  }
  return lines.join('\n');
}

/**
 * -h or --help among the arguments: print the script's usage and exit before it does any work.
 * Call it first, after the imports (which only define things).
 */
export function exitWithUsageOnHelp(file: string, argv: readonly string[] = process.argv.slice(2)): void {
  if (!argv.some((a) => a === '-h' || a === '--help')) return;
  process.stdout.write(usageOf(file) + '\n');
  process.exit(0);
}
