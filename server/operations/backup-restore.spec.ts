import { execFileSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { count } from 'drizzle-orm';
import { createDb } from '../../db/client';
import { auditEvents, readings, runs } from '../../db/schema';
import { verifyAuditChain } from '../audit/audit-checkpoint';
import { recordAuditAlone } from '../audit/audit-service';
import { testAuditAction } from '../../testing/test-audit-action';
import { startHarness, type ApiHarness } from '../../testing/api-harness';

const root = join(__dirname, '..', '..');
const tool = (name: string, ...args: string[]) => execFileSync('bash', [join(root, 'tools', name), ...args], { cwd: root, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] }).trim();

let h: ApiHarness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.close());

describe('tools/backup and tools/restore', () => {
  it('restore into a fresh database with the same rows and a valid audit chain', async () => {
    await recordAuditAlone(h.handle.db, { action: testAuditAction('test.before-backup'), entityType: 'test' });
    const source = new URL(process.env['DATABASE_URL']!).pathname.slice(1);
    const file = join(root, '.data', 'backups', `${source}-spec-${Date.now()}.dump`);
    const target = `${source}_restored_${Date.now()}`;
    try {
      expect(tool('backup', source, file)).toBe(file);
      expect(tool('restore', file, target)).toBe(target);
      // Restoring over an existing database is refused: nothing is overwritten.
      expect(() => tool('restore', file, target)).toThrow(/exists already/);
      const restored = createDb(process.env['DATABASE_URL']!.replace(/\/[^/]+$/, `/${target}`), 1);
      try {
        for (const table of [runs, readings, auditEvents]) {
          const [{ n: a }] = await h.handle.db.select({ n: count() }).from(table);
          const [{ n: b }] = await restored.db.select({ n: count() }).from(table);
          expect(b).toBe(a);
        }
        const check = await verifyAuditChain(restored.db, h.config);
        expect(check.valid).toBe(true);
        expect(check.checked).toBeGreaterThan(5);
      } finally {
        await restored.close();
      }
    } finally {
      tool('pg', 'drop', target);
      rmSync(file, { force: true });
    }
  });
});
