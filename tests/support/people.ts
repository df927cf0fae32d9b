/** People and sign-ins for API tests, made through the product's own code paths. */
import { roles, type Role } from '@loadwright/contracts';
import { users, type Database } from '@loadwright/db';
import request from 'supertest';
import { hashPassword } from '../../apps/api/src/auth/passwords';

/** The password every test person gets. */
export const testPassword = 'correct horse battery staple';

/** A signed-in browser: its cookies and the CSRF header to send on writes. */
export interface SignedIn {
  cookie: string[];
  csrf: string;
  userId: number;
}

/** Creates one active person per role; returns their e-mails by role. */
export async function createPeople(db: Database, suffix = ''): Promise<Record<Role, { id: number; email: string }>> {
  const passwordHash = await hashPassword(testPassword);
  const result = {} as Record<Role, { id: number; email: string }>;
  for (const role of roles) {
    const email = `${role}${suffix}@test.example`;
    const [row] = await db
      .insert(users)
      .values({ email, displayName: `Test ${role}`, role, passwordHash })
      .returning({ id: users.id });
    result[role] = { id: row!.id, email };
  }
  return result;
}

/** Signs in through the API and returns the cookies as a browser would keep them. */
export async function signIn(baseUrl: string, email: string, password = testPassword): Promise<SignedIn> {
  const response = await request(baseUrl).post('/api/auth/sign-in').send({ email, password });
  if (response.status !== 200) throw new Error(`sign-in as ${email} failed: ${response.status} ${JSON.stringify(response.body)}`);
  const setCookies = ([] as string[]).concat(response.headers['set-cookie'] ?? []);
  const cookie = setCookies.map((c) => c.split(';')[0]!);
  const csrf = cookie.find((c) => c.startsWith('lw_csrf='))!.slice('lw_csrf='.length);
  return { cookie, csrf, userId: response.body.user.id };
}
