/** The key that signs session cookies for `npm start`: made once per checkout and kept in .data/. */
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/** Reads the key from `path`, creating it (readable by the owner only) the first time. */
export function ensureSessionSecret(path: string): string {
  if (existsSync(path)) return readFileSync(path, 'utf8').trim();
  mkdirSync(dirname(path), { recursive: true });
  const secret = randomBytes(48).toString('base64');
  writeFileSync(path, secret, { mode: 0o600 });
  return secret;
}
