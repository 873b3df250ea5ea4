import type { Request } from 'express';
import { isIP } from 'node:net';

/**
 * The client's address as Express resolved it (the socket's, or the one the configured proxy vouched
 * for), kept only when it is a well-formed IPv4 or IPv6 address: never text a client typed.
 */
export function clientIp(req: Request): string | null {
  const ip = req.ip ?? req.socket?.remoteAddress ?? null;
  return ip && isIP(ip) ? ip : null;
}
