import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';

// The house reads one way. Production code (server/, db/) never reaches into the test support
// folder (testing/): harnesses seed people with known passwords, start catchers and fuzz writes.
// The demo seed and the migration runner are entry points that use the server's modules, so the
// server never imports db/seed; the schema and the client are the bottom and import no server code.
// The contract (contract/) is the other bottom: the Angular client and the server both import it.
const root = resolve(__dirname, '..');

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return entry.name === 'node_modules' ? [] : sourceFiles(path);
    return /\.ts$/.test(entry.name) && !/\.spec\.ts$/.test(entry.name) ? [path] : [];
  });
}

/** Every module a file names: static imports and re-exports, import() and require(). */
export function importedPaths(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const pattern = /(?:\bfrom\s*|\bimport\s*\(\s*|\brequire\s*\(\s*|^\s*import\s+)['"]([^'"]+)['"]/gm;
  return [...text.matchAll(pattern)]
    .map((m) => m[1])
    .filter((spec) => spec.startsWith('.'))
    .map((spec) => relative(root, resolve(dirname(file), spec)));
}

function offenders(folders: string[], forbidden: (target: string, file: string) => boolean): string[] {
  return folders.flatMap((folder) =>
    sourceFiles(join(root, folder)).flatMap((file) =>
      importedPaths(file)
        .filter((target) => forbidden(target, relative(root, file)))
        .map((target) => `${relative(root, file)} → ${target}`),
    ),
  );
}

const under = (folder: string) => (target: string) => target === folder || target.startsWith(folder + sep);

describe('import direction', () => {
  it('finds the imports it scans for (a scanner that sees nothing would pass anything)', () => {
    // server/app.ts builds the app from the routes table; if this breaks, the scanner is blind.
    expect(importedPaths(join(root, 'server', 'app.ts'))).toContain(join('server', 'routes'));
  });

  it('no production file under server/ or db/ imports the test support folder', () => {
    expect(offenders(['server', 'db'], under('testing'))).toEqual([]);
  });

  it('the server never imports the demo seed (the seed depends on the server, not the other way)', () => {
    expect(offenders(['server'], under(join('db', 'seed')))).toEqual([]);
  });

  it('the schema and the database client import nothing from the server', () => {
    const bottom = (file: string) => !file.startsWith(join('db', 'seed') + sep) && file !== join('db', 'migrate.ts');
    expect(offenders(['db'], (target, file) => bottom(file) && under('server')(target))).toEqual([]);
  });

  it('the runs service is the runs router\'s alone: other modules take run helpers from their own files', () => {
    // visibleProjectIds → run-access, nextCode → run-code, runHistory → run-history, insertReadings → readings-bulk.
    const service = join('server', 'runs', 'runs-service');
    const router = join('server', 'runs', 'runs-router.ts');
    expect(offenders(['server', 'db', 'tools'], (target, file) => target === service && file !== router)).toEqual([]);
  });

  it('the contract (contract/) imports only itself: no package, no client, no server code', () => {
    const files = sourceFiles(join(root, 'contract'));
    expect(files.length).toBeGreaterThan(3);
    const named = files.flatMap((file) => {
      const text = readFileSync(file, 'utf8');
      return [...text.matchAll(/(?:\bfrom\s*|^\s*import\s+)['"]([^'"]+)['"]/gm)].map((m) => ({ file, spec: m[1] }));
    });
    const outside = named.filter(({ file, spec }) => !spec.startsWith('.') || !under('contract')(relative(root, resolve(dirname(file), spec))));
    expect(outside.map(({ file, spec }) => `${relative(root, file)} → ${spec}`)).toEqual([]);
  });

  it('the client reads the server only through the contract: no production file under src/ imports server/ or db/', () => {
    expect(offenders(['src'], (target) => under('server')(target) || under('db')(target))).toEqual([]);
  });

  it('routers are mounted, never imported for their helpers: only app.ts and routes.ts import a router', () => {
    const mounts = [join('server', 'app.ts'), join('server', 'routes.ts')];
    expect(offenders(['server', 'db', 'tools'], (target, file) => /-router$/.test(target) && !mounts.includes(file))).toEqual([]);
  });

  it('the contract shared by client and server imports nothing but itself (client → contract ← server)', () => {
    expect(offenders(['contract'], (target) => !under('contract')(target))).toEqual([]);
    // Nor any package: both builds compile it, so it holds types and constant tables only.
    const packages = sourceFiles(join(root, 'contract')).flatMap((file) =>
      [...readFileSync(file, 'utf8').matchAll(/(?:\bfrom\s*|\bimport\s*\(\s*|\brequire\s*\(\s*|^\s*import\s+)['"]([^'".][^'"]*)['"]/gm)]
        .map((m) => `${relative(root, file)} → ${m[1]}`));
    expect(packages).toEqual([]);
  });
});
