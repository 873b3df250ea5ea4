import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

// Every resource the app mounts lives in the same shape as server/instruments/: a thin router, a
// service, a DTO file and a router spec, mounted at its own path. A resource without one of them is
// listed here with the reason, so that a new gap fails this spec instead of passing unnoticed.
const server = __dirname;

/** Routers the app mounts: server/app.ts (health, auth) and server/routes.ts (the rest). */
function mountedRouters(): { folder: string; name: string }[] {
  return ['app.ts', 'routes.ts'].flatMap((file) =>
    [...readFileSync(join(server, file), 'utf8').matchAll(/from '\.\/([\w-]+)\/([\w-]+)-router'/g)].map((m) => ({ folder: m[1], name: m[2] })),
  );
}

type Part = 'service' | 'dto' | 'router.spec';
const EXCEPTIONS: Record<string, Partial<Record<Part, string>>> = {
  health: { service: 'one query on the pool, nothing to keep apart', dto: 'takes no input' },
  home: { dto: 'GET only: takes no input' },
  balance: { dto: 'the body is a run document, checked by the engine\'s own validator (balance-service.ts)' },
  exports: { service: 'one service per export: run-report.ts and audit-export.ts' },
};

/** Routers mounted at '/' because their paths belong under other resources' paths. */
const MOUNTED_AT_ROOT: Record<string, string> = {
  exports: '/runs/:id/report.pdf and /audit/export',
  standardizations: '/apparatus/:id/standardizations, /apparatus/:id/changes and /apparatus-due',
};

describe('the house shape', () => {
  const routers = mountedRouters();

  it('finds the mounted routers (a scanner that sees none would pass anything)', () => {
    expect(routers.map((r) => r.folder)).toEqual(expect.arrayContaining(['health', 'auth', 'runs', 'instruments', 'projects', 'people', 'gases', 'apparatus']));
  });

  it.each(['service', 'dto', 'router.spec'] as Part[])('every mounted resource has its %s file, or a stated reason', (part) => {
    const missing = routers
      .filter(({ folder, name }) => !existsSync(join(server, folder, `${name}-${part}.ts`)) && !EXCEPTIONS[folder]?.[part])
      .map(({ folder, name }) => `server/${folder}/${name}-${part}.ts`);
    expect(missing).toEqual([]);
  });

  it('lists no exception that is no longer one', () => {
    const stale = Object.entries(EXCEPTIONS).flatMap(([folder, parts]) =>
      Object.keys(parts).filter((part) => {
        const router = routers.find((r) => r.folder === folder);
        return !router || existsSync(join(server, folder, `${router.name}-${part}.ts`));
      }).map((part) => `${folder}: ${part}`),
    );
    expect(stale).toEqual([]);
  });

  it('mounts each resource at its own path', () => {
    const routes = readFileSync(join(server, 'routes.ts'), 'utf8');
    const atRoot = [...routes.matchAll(/router\.use\('\/', (\w+)Router\(/g)].map((m) => m[1]);
    const folders = atRoot.map((fn) => routers.find((r) => routes.includes(`import { ${fn}Router } from './${r.folder}/`))?.folder ?? fn);
    expect(folders.filter((f) => !(f in MOUNTED_AT_ROOT))).toEqual([]);
  });

  it('keeps routers thin: no router queries the database or writes the audit trail itself', () => {
    const thick = routers.flatMap(({ folder, name }) => {
      const text = readFileSync(join(server, folder, `${name}-router.ts`), 'utf8');
      return [
        /from 'drizzle-orm'/.test(text) ? `${folder}/${name}-router.ts builds queries (drizzle-orm)` : [],
        /\brecordAudit(Alone)?\b/.test(text) ? `${folder}/${name}-router.ts writes audit rows` : [],
        /\bdb\.(select|insert|update|delete|transaction|execute)\b/.test(text) ? `${folder}/${name}-router.ts uses the database handle` : [],
      ].flat();
    });
    expect(thick).toEqual([]);
  });
});
