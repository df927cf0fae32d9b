/** Reads the messages the local mail catcher kept: one JSON file per message, newest first. */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

/** A message as the catcher received it over SMTP. */
export interface CaughtMail {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
}

/** Every kept message, newest first. */
export function listCaughtMail(folder: string): CaughtMail[] {
  if (!existsSync(folder)) return [];
  return readdirSync(folder)
    .filter((name) => /^[\w-]+\.json$/.test(name))
    .sort()
    .reverse()
    .map((name) => JSON.parse(readFileSync(join(folder, name), 'utf8')) as CaughtMail);
}

/** One kept message, or null (ids are checked so no path outside the folder can be read). */
export function readCaughtMail(folder: string, id: string): CaughtMail | null {
  if (!/^[\w-]+$/.test(id)) return null;
  const path = join(folder, `${id}.json`);
  return existsSync(path) ? (JSON.parse(readFileSync(path, 'utf8')) as CaughtMail) : null;
}
