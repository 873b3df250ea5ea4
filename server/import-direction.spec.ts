import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve, sep } from 'node:path';

// The house reads one way: production code (server/, db/) never reaches into the test support
// folder (testing/): harnesses seed people with known passwords, start catchers and fuzz writes.
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
});
