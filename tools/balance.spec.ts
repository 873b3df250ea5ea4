import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

// The CLI end to end, as `npm run balance -- FILE.json` runs it.
const ROOT = join(__dirname, '..');
const cli = (...args: string[]) =>
  spawnSync(process.execPath, [join(ROOT, 'node_modules', 'tsx', 'dist', 'cli.mjs'), '--tsconfig', join(ROOT, 'tsconfig.server.json'), join(ROOT, 'tools', 'balance.ts'), ...args], { encoding: 'utf8', cwd: ROOT });

describe('tools/balance.ts', () => {
  it('prints the result of a demo run as JSON and exits 0', () => {
    const res = cli(join(ROOT, 'fixtures', 'runs', 'calorimetric-heat-leak-forgotten.json'), '--draws', '2000', '--seed', '5');
    expect(res.status).toBe(0);
    const out = JSON.parse(res.stdout);
    expect(out.verdict).toBe('breaks');
    // The command-line flags, and the lab settings' documented defaults (README, docs/run-document.md).
    expect(out.settings).toEqual({
      coverageFactor: 2, draws: 2000, seed: 5, indeterminateFraction: 0.2,
      flagCoverage: 3, isothermalDriftFraction: 0.01, isochoricVolumeFraction: 0.005, adiabaticHeatFraction: 0.01,
      indexTolerance: 0.05, heaterResistanceTolerance: 0.02, riseMethod: 'regnault-pfaundler',
    });
    expect(out.hints.map((h: { code: string }) => h.code)).toContain('FORGOTTEN_HEAT_LEAK');
  }, 30000);
  it('exits 1 with each problem on stderr for an invalid document, and for unreadable files', () => {
    const dir = mkdtempSync(join(tmpdir(), 'qwell-cli-'));
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ format: 'qwell.run', version: 1 }));
    const res = cli(bad);
    expect(res.status).toBe(1);
    expect(res.stdout).toBe('');
    expect(res.stderr).toMatch(/is not a valid run document:\n {2}runDate: must be an ISO 8601 date/);
    const missing = cli(join(dir, 'nope.json'));
    expect(missing.status).toBe(1);
    expect(missing.stderr).toMatch(/cannot read/);
    writeFileSync(join(dir, 'broken.json'), '{ "format": ');
    expect(cli(join(dir, 'broken.json')).stderr).toMatch(/is not valid JSON/);
  }, 30000);
});
