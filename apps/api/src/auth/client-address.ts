import type { Request } from 'express';

/** The caller's address as Express resolved it (trusting only a loopback proxy). */
export function clientAddress(req: Request): string {
  return req.ip ?? req.socket.remoteAddress ?? 'unknown';
}
