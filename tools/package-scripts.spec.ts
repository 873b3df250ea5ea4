import { spawnSync } from 'node:child_process';
import { accessSync, constants, existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

// Every script in package.json names a runner and a target that exist, and answers --help without
// doing its work (no database, server, build or test run started). The ones that do work as soon as
// they start, with nothing to ask them first, are checked statically only and listed with the reason.
const root = join(__dirname, '..');
const scripts: Record<string, string> = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8')).scripts;
const read = (file: string) => readFileSync(join(root, file), 'utf8');

/** Scripts not run with --help, and why. */
const STATIC_ONLY: Record<string, string> = {
  'serve:api': 'server/main.ts listens as soon as it starts',
  'db:migrate': 'db/migrate.ts migrates as soon as it starts',
  'db:seed': 'db/seed/main.ts seeds as soon as it starts',
  typecheck: 'two full tsc runs, a minute of CPU; tsc itself is the check',
};

const serverTsconfig = JSON.parse(read('tsconfig.server.json')) as { include: string[] };
const angular = JSON.parse(read('angular.json')) as { projects: Record<string, { architect: Record<string, { configurations?: Record<string, unknown> }> }> };

/** What is wrong with one command of a script (empty when it would run). */
function problems(command: string): string[] {
  const [runner, ...args] = command.trim().split(/\s+/);
  const found: string[] = [];
  const need = (ok: boolean, what: string) => {
    if (!ok) found.push(what);
  };
  if (runner !== 'bash') need(existsSync(join(root, 'node_modules', '.bin', runner)), `runner ${runner} is not in node_modules/.bin`);
  switch (runner) {
    case 'bash': {
      const file = args[0];
      need(existsSync(join(root, file)), `${file} does not exist`);
      if (!existsSync(join(root, file))) break;
      const syntax = spawnSync('bash', ['-n', join(root, file)], { encoding: 'utf8' });
      need(syntax.status === 0, `${file} is not valid bash: ${syntax.stderr}`);
      break;
    }
    case 'tsx': {
      const tsconfig = args[args.indexOf('--tsconfig') + 1];
      need(args.includes('--tsconfig') && existsSync(join(root, tsconfig)), `tsconfig ${tsconfig} does not exist`);
      const file = args.find((a) => a.endsWith('.ts'));
      need(file !== undefined && existsSync(join(root, file)), `${file ?? 'no .ts file'} does not exist`);
      // tsc -p tsconfig.server.json (npm run typecheck) covers only the files its include names.
      need(file !== undefined && serverTsconfig.include.some((glob) => file.startsWith(glob.split('*')[0])), `${file} is outside tsconfig.server.json's include`);
      break;
    }
    case 'ng': {
      const project = Object.values(angular.projects)[0];
      const target = project?.architect[args[0]];
      need(target !== undefined, `angular.json has no ${args[0]} target`);
      const i = args.indexOf('--configuration');
      if (i >= 0) need(target?.configurations?.[args[i + 1]] !== undefined, `angular.json's ${args[0]} target has no ${args[i + 1]} configuration`);
      break;
    }
    case 'jest':
      need(existsSync(join(root, 'jest.config.js')), 'jest.config.js does not exist');
      break;
    case 'drizzle-kit':
      need(existsSync(join(root, 'drizzle.config.ts')), 'drizzle.config.ts does not exist');
      break;
    case 'tsc': {
      const project = args[args.indexOf('-p') + 1];
      need(args.includes('-p') && existsSync(join(root, project)), `tsconfig ${project} does not exist`);
      break;
    }
    default:
      found.push(`no rule here for the runner ${runner}: add one to this spec`);
  }
  return found;
}

/** Whether the script's target stops at --help before any work (else running it here would do the work). */
function answersHelp(command: string): boolean {
  const [runner, ...args] = command.trim().split(/\s+/);
  if (runner === 'bash') return /help_if_asked "\$@"|-h\|--help\)/.test(read(args[0]));
  if (runner === 'tsx') return read(args.find((a) => a.endsWith('.ts'))!).includes('exitWithUsageOnHelp(__filename)');
  // The CLIs below answer --help themselves.
  return ['ng', 'jest', 'drizzle-kit'].includes(runner);
}

describe('package.json scripts', () => {
  it('lists its static-only scripts by their real names', () => {
    for (const name of Object.keys(STATIC_ONLY)) expect(scripts).toHaveProperty([name]);
  });

  it.each(Object.entries(scripts))('%s names a runner and a target that exist (%s)', (_name, script) => {
    expect(script.split('&&').flatMap(problems)).toEqual([]);
  });

  it.each(Object.entries(scripts).filter(([name]) => !(name in STATIC_ONLY)))('%s answers --help and does nothing else (%s)', (name, script) => {
    expect(script).not.toContain('&&');
    expect(answersHelp(script)).toBe(true);
    const run = spawnSync('sh', ['-c', `${script} --help`], {
      cwd: root,
      encoding: 'utf8',
      timeout: 60_000,
      env: { ...process.env, PATH: `${join(root, 'node_modules', '.bin')}:${process.env['PATH']}`, NG_CLI_ANALYTICS: 'false' },
    });
    expect({ name, status: run.status, stderr: run.status === 0 ? '' : run.stderr }).toEqual({ name, status: 0, stderr: '' });
    expect(run.stdout.trim().length).toBeGreaterThan(20);
  });

  it('keeps every script under tools/ that package.json runs with bash executable', () => {
    const files = Object.values(scripts).flatMap((s) => [...s.matchAll(/bash (tools\/[\w.-]+)/g)].map((m) => m[1]));
    expect(files.length).toBeGreaterThan(5);
    for (const file of files) expect(() => accessSync(join(root, file), constants.X_OK)).not.toThrow();
  });
});
