/** What the API's routes need from the process that hosts them, built once at start. */
import type { Database } from '@loadwright/db';
import type { Pool } from 'pg';
import type { Logger } from 'pino';

export interface AppContext {
  db: Database;
  pool: Pool;
  logger: Logger;
  /** Key that signs session tokens and CSRF tokens (32+ random bytes). */
  sessionSecret: Uint8Array;
  /** Mark cookies Secure: true when people reach the app over HTTPS. */
  secureCookies: boolean;
  /** The address people open, for links in e-mails, e.g. http://127.0.0.1:4280. */
  publicUrl: string;
  /** Where the local mail catcher keeps messages; absent when mail goes to a real server (SMTP_URL). */
  outboxFolder?: string;
  /** Folder of the built web app; absent in API-only tests. */
  webDist?: string;
  /** Folder where uploaded files wait for their import job (default: the system temp folder's loadwright-uploads). */
  uploadFolder?: string;
  /** Largest upload accepted, in bytes (from UPLOAD_MAX_MB; default 512 MiB). */
  uploadMaxBytes?: number;
}
