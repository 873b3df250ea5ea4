import type { CookieOptions, RequestHandler, Response } from 'express';
import { sql } from 'drizzle-orm';
import { jwtVerify, SignJWT } from 'jose';
import type { Database } from '../../db/client';
import { dataVersions, people, type Role } from '../../db/schema';
import type { Config } from '../config';
import { FreshBatcher } from './fresh-batcher';
import { forbidden, unauthorized } from './problem';
import { roleWithArticle } from './role-labels';

export const SESSION_COOKIE = 'qwell_session';
// Pinned: a token that names any other algorithm (or "none") is refused by jwtVerify.
const ALGORITHM = 'HS256';
const ISSUER = 'qwell';

/** The signed-in person as the routes see it, read from the database after each request arrived (batched under load: see FreshBatcher). */
export interface SessionPerson {
  id: number;
  email: string;
  name: string;
  role: Role;
}

declare module 'express-serve-static-core' {
  interface Request {
    person?: SessionPerson;
    /** The "records" data version read with the person (see db/schema/data-versions.ts). */
    recordsVersion?: number;
  }
}

export function cookieOptions(config: Config): CookieOptions {
  return { httpOnly: true, sameSite: 'strict', secure: config.secureCookies, path: '/' };
}

export async function issueSession(res: Response, config: Config, person: SessionPerson): Promise<void> {
  // iatMs: the JWT's iat has whole seconds, too coarse to tell a token from a sign-out in the same second.
  const token = await new SignJWT({ role: person.role, iatMs: Date.now() })
    .setProtectedHeader({ alg: ALGORITHM })
    .setSubject(String(person.id))
    .setIssuer(ISSUER)
    .setIssuedAt()
    .setExpirationTime(`${config.sessionHours}h`)
    .sign(config.sessionSecret);
  res.cookie(SESSION_COOKIE, token, { ...cookieOptions(config), maxAge: config.sessionHours * 3600 * 1000 });
}

export function clearSession(res: Response, config: Config): void {
  res.clearCookie(SESSION_COOKIE, cookieOptions(config));
}

interface VerifiedToken {
  personId: number;
  issuedAtMs: number;
  expiresAtMs: number;
}

// Tokens whose signature has been checked, so a busy session is not re-verified on every request.
// The token string is the key, so a changed byte is a different (unverified) token; expiry is
// checked on every use; revocation and deactivation are read from the database on every request.
const VERIFIED_TOKENS_MAX = 10_000;

async function verifyToken(config: Config, verified: Map<string, VerifiedToken>, token: string): Promise<VerifiedToken | null> {
  const known = verified.get(token);
  if (known) return known.expiresAtMs > Date.now() ? known : null;
  try {
    const { payload } = await jwtVerify(token, config.sessionSecret, { algorithms: [ALGORITHM], issuer: ISSUER, requiredClaims: ['sub', 'exp'] });
    const entry = {
      personId: Number(payload.sub),
      issuedAtMs: typeof payload['iatMs'] === 'number' ? payload['iatMs'] : (payload.iat ?? 0) * 1000,
      expiresAtMs: (payload.exp ?? 0) * 1000,
    };
    if (verified.size >= VERIFIED_TOKENS_MAX) verified.clear();
    verified.set(token, entry);
    return entry;
  } catch {
    return null; // expired, tampered or foreign tokens count as no session
  }
}

/** Reads the session cookie when present; never refuses (requireSignIn does that). */
export function sessionReader(config: Config, db: Database): RequestHandler {
  const verified = new Map<string, VerifiedToken>();
  // One round trip for every request arriving during the previous one: the people (active?
  // revoked?) and the records version for the read cache, read after each request came in.
  const peopleQuery = db
    .select({
      id: people.id, email: people.email, name: people.name, role: people.role, active: people.active, validAfter: people.sessionsValidAfter,
      recordsVersion: sql<string>`(SELECT ${dataVersions.version} FROM ${dataVersions} WHERE ${dataVersions.name} = 'records')`,
    })
    .from(people)
    .where(sql`${people.id} = ANY(${sql.placeholder('ids')}::int[])`)
    .prepare('session_people');
  const batcher = new FreshBatcher(async (ids: number[]) => new Map((await peopleQuery.execute({ ids })).map((row) => [row.id, row])));
  return async (req, _res, next) => {
    const token: unknown = req.cookies?.[SESSION_COOKIE];
    if (typeof token !== 'string' || token === '') return next();
    const session = await verifyToken(config, verified, token);
    if (!session) return next();
    const row = await batcher.load(session.personId);
    const revoked = row?.validAfter ? session.issuedAtMs <= row.validAfter.getTime() : false;
    if (row?.active && !revoked) {
      req.person = { id: row.id, email: row.email, name: row.name, role: row.role };
      if (row.recordsVersion !== null) req.recordsVersion = Number(row.recordsVersion);
    }
    next();
  };
}

export const requireSignIn: RequestHandler = (req, _res, next) => {
  next(req.person ? undefined : unauthorized());
};

const roleNames: Record<Role, string> = {
  technician: 'technicians',
  assistant: 'student assistants',
  investigator: 'principal investigators',
  quality: 'quality officers',
  admin: 'administrators',
};

/** Server-side role check; every route outside auth and health goes through one. */
export function requireRole(...allowed: Role[]): RequestHandler {
  return (req, _res, next) => {
    if (!req.person) return next(unauthorized());
    if (!allowed.includes(req.person.role)) {
      return next(forbidden(`This is for ${allowed.map((r) => roleNames[r]).join(', ')} only; you are signed in as ${roleWithArticle(req.person.role)}.`));
    }
    next();
  };
}
