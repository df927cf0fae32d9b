/**
 * Sign-in, roles and the admin pages in a real browser against a real API with the demo seeded: each
 * demo role sees only what it may do, a refused address says so, an invite travels through the Outbox
 * to the set-password page and a first sign-in, API tokens show their secret once, the audit log reads.
 */
import { mkdir } from 'node:fs/promises';
import { resolve } from 'node:path';
import type { Role } from '@loadwright/contracts';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recordAudit } from '@loadwright/audit';
import { demoScenario } from '../../fixtures/demo/scenario';
import { seedDemo } from '../../libs/db/src/seed/seed-demo';
import { signIn } from '../support/people';
import { type TestServer, startTestServer } from '../support/server';
import { blockingViolations, findAccessibilityViolations } from './support/accessibility';
import { type TestBrowser, launchBrowser } from './support/browser';
import { watchRequests } from './support/network-guard';
import { signInThroughPage } from './support/sign-in';

const artifacts = resolve(import.meta.dirname, '../.artifacts');
const password = demoScenario.demoPassword;
const account = (role: Role) => demoScenario.accounts.find((candidate) => candidate.role === role)!;
const adminLinks = ['People', 'API tokens', 'Audit log', 'Outbox'];
/** Entries per audit log page, as apps/web/src/app/audit-log/audit-client.ts asks for them. */
const AUDIT_PAGE_SIZE = 50;
const newcomer = { email: 'hollis.marsh@tallowmere.example', name: 'Hollis Marsh', password: 'silo-lantern-harrow-brook' };

let browser: TestBrowser;
let server: TestServer;
let page: Page;
let requests: ReturnType<typeof watchRequests>;

beforeAll(async () => {
  await mkdir(artifacts, { recursive: true });
  server = await startTestServer();
  await seedDemo(server.databaseUrl);
  browser = await launchBrowser();
  page = await browser.context.newPage();
  requests = watchRequests(page);
}, 120_000);

afterAll(async () => {
  await page?.close();
  await browser?.close();
  await server?.close();
});

/** Forgets every cookie, so the next page load is a signed-out browser. */
async function signOutBrowser(): Promise<void> {
  await browser.context.clearCookies();
}

/** The top bar's link to the account page, named after the person and their role. */
const accountLink = (name: string, role: Role) =>
  page.getByRole('link', { name: new RegExp(`^Your account:\\s*${name}\\s*,\\s*${role}$`) });

/** The main navigation. */
const navigation = () => page.getByRole('navigation', { name: 'Sections' });

describe('sign-in page', () => {
  it("shows the API's message for a wrong password and keeps the person on the page", async () => {
    await signOutBrowser();
    await page.goto(`${server.url}/overview`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail address').fill(account('planner').email);
    await page.getByLabel('Password', { exact: true }).fill('not-the-password-at-all');
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    const alert = page.getByRole('alert');
    await alert.waitFor();
    expect(await alert.textContent()).toContain('The e-mail address or password is not right.');
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });

  it('checks the form before asking the API', async () => {
    await page.getByLabel('E-mail address').fill('not-an-address');
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.getByText('Enter a valid e-mail address').waitFor();
  });

  it('passes axe-core and looks right on a wide screen and a phone', async () => {
    await page.reload({ waitUntil: 'networkidle' });
    await page.getByText('Service: All services working').waitFor({ timeout: 15_000 });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'sign-in-wide.png') });
    await page.setViewportSize({ width: 390, height: 844 });
    await page.reload({ waitUntil: 'networkidle' });
    await page.getByText('Service: All services working').waitFor({ timeout: 15_000 });
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'sign-in-phone.png'), fullPage: true });
    await page.setViewportSize({ width: 1440, height: 900 });
  });
});

describe('each demo role sees only what it may do', () => {
  for (const role of ['admin', 'steward', 'planner', 'viewer'] as const) {
    it(`${role}: navigation and top bar`, async () => {
      await signOutBrowser();
      await signInThroughPage(page, server.url, account(role).email, password);
      await page.getByRole('heading', { level: 1, name: 'Overview' }).waitFor();
      expect(await accountLink(account(role).displayName, role).isVisible()).toBe(true);
      const adminGroup = navigation().getByRole('heading', { name: 'People and settings' });
      expect(await adminGroup.count()).toBe(role === 'admin' ? 1 : 0);
      for (const name of adminLinks)
        expect(await navigation().getByRole('link', { name, exact: true }).count()).toBe(role === 'admin' ? 1 : 0);
      expect(await navigation().getByRole('link', { name: 'Overview', exact: true }).count()).toBe(1);
    });
  }

  it('a viewer who types the People address is told it is not for their role', async () => {
    await signOutBrowser();
    await signInThroughPage(page, server.url, account('viewer').email, password);
    await page.goto(`${server.url}/people`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { level: 1, name: 'Not allowed for your role' }).waitFor();
    expect(await page.getByRole('alert').textContent()).toContain('People is not available to your role (viewer)');
    expect(await page.title()).toBe('Not allowed · Loadwright');
    expect(requests.all.some((url) => url.endsWith('/api/people'))).toBe(false);
  });

  it('signing out ends the session: the Overview asks for sign-in again', async () => {
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    await page.goto(`${server.url}/overview`, { waitUntil: 'networkidle' });
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });
});

describe('a forgotten password', () => {
  it('is reset through the e-mailed link, and the new password signs in', async () => {
    const planner = account('planner');
    const newPassword = 'harvest-moon-over-the-weir';
    await signOutBrowser();
    await page.goto(`${server.url}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail address').fill(planner.email);
    await page.getByRole('link', { name: 'Forgot password?' }).click();
    await page.getByRole('heading', { level: 1, name: 'Reset your password' }).waitFor();
    expect(await page.getByLabel('E-mail address').inputValue()).toBe(planner.email);
    await page.getByRole('button', { name: 'Send reset link' }).click();
    await page.getByRole('status').getByText('If that address belongs to an active account, a reset link is on its way.').waitFor();
    // Read the link from what the mail catcher received over SMTP, as an admin would on the Outbox page.
    const admin = await signIn(server.url, account('admin').email, password);
    const headers = { cookie: admin.cookie.join('; ') };
    // The answer leaves before the mail is queued, and the send-mail job delivers it a moment later: wait for it.
    const findReset = async () => {
      const caught = (await (await fetch(`${server.url}/api/outbox`, { headers })).json()) as {
        id: string;
        to: string[];
        subject: string;
      }[];
      return caught.find((mail) => mail.to.includes(planner.email) && mail.subject === 'Reset your Loadwright password');
    };
    await expect.poll(findReset, { timeout: 10_000 }).toBeDefined();
    const reset = (await findReset())!;
    const { text } = (await (await fetch(`${server.url}/api/outbox/${reset.id}`, { headers })).json()) as { text: string };
    const link = new URL(text.match(/https?:\/\/\S+/)![0]);
    await page.goto(`${server.url}${link.pathname}${link.search}`, { waitUntil: 'networkidle' });
    await page.getByLabel('New password', { exact: true }).fill(newPassword);
    await page.getByLabel('Repeat the new password').fill(newPassword);
    await page.getByRole('button', { name: 'Set password' }).click();
    await page.getByRole('status').getByText('Password set. You can sign in now.').waitFor();
    await page.getByRole('link', { name: 'Go to sign in' }).click();
    await page.getByLabel('E-mail address').fill(planner.email);
    await page.getByLabel('Password', { exact: true }).fill(newPassword);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/overview');
  });
});

describe('a session ended by the server', () => {
  it('sends the person to sign in again, says why, and brings them back to the page', async () => {
    await signOutBrowser();
    await signInThroughPage(page, server.url, account('steward').email, password, '/account');
    // An admin changes the steward's role elsewhere: the API ends every session of theirs at once.
    const admin = await signIn(server.url, account('admin').email, password);
    const change = await fetch(`${server.url}/api/people`, { headers: { cookie: admin.cookie.join('; ') } });
    const steward = ((await change.json()) as { id: number; email: string }[]).find((person) => person.email === account('steward').email)!;
    const patched = await fetch(`${server.url}/api/people/${steward.id}`, {
      method: 'PATCH',
      headers: { cookie: admin.cookie.join('; '), 'x-csrf-token': admin.csrf, 'content-type': 'application/json' },
      body: JSON.stringify({ role: 'planner' }),
    });
    expect(patched.status).toBe(200);
    // Whichever request of the page meets the ended session first (this form, or a poll of the page in
    // the background) must send the person to sign in; the form may already be gone when we reach it.
    const sentToSignIn = page.waitForURL((url) => url.pathname === '/sign-in');
    try {
      await page.getByLabel('Current password').fill(password, { timeout: 5_000 });
      await page.getByLabel('New password', { exact: true }).fill('a-new-long-passphrase', { timeout: 5_000 });
      await page.getByLabel('Repeat the new password').fill('a-new-long-passphrase', { timeout: 5_000 });
      await page.getByRole('button', { name: 'Change password' }).click({ timeout: 5_000 });
    } catch {
      // A background request got there first; the sign-in page below is the same either way.
    }
    await sentToSignIn;
    expect(await page.getByRole('status').textContent()).toContain('Your session has ended.');
    await page.getByLabel('E-mail address').fill(account('steward').email);
    await page.getByLabel('Password', { exact: true }).fill(password);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/account');
    expect(await accountLink(account('steward').displayName, 'planner').isVisible()).toBe(true);
  });
});

describe('an admin invites someone, who signs in through the e-mailed link', () => {
  beforeAll(async () => {
    await signOutBrowser();
    await signInThroughPage(page, server.url, account('admin').email, password, '/people');
  });

  it('lists the people with role, status and last sign-in, and passes axe-core', async () => {
    const table = page.getByRole('table', { name: 'People and their roles' });
    await table.waitFor();
    for (const { displayName } of demoScenario.accounts)
      expect(await table.getByRole('rowheader', { name: new RegExp(displayName) }).count()).toBe(1);
    const adminRow = table.getByRole('row', { name: new RegExp(account('admin').displayName) });
    expect(await adminRow.textContent()).toContain('Active');
    expect(await adminRow.textContent()).not.toContain('Never');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it("shows the API's field error on the e-mail control when the address already has an account", async () => {
    await page.getByRole('button', { name: 'Invite someone' }).click();
    const dialog = page.getByRole('dialog', { name: 'Invite someone' });
    await dialog.getByLabel('E-mail address').fill(account('planner').email);
    await dialog.getByLabel('Name').fill('Someone Again');
    const answer = page.waitForResponse((response) => response.url().endsWith('/api/people') && response.request().method() === 'POST');
    await dialog.getByRole('button', { name: 'Send invite' }).click();
    expect((await answer).status()).toBe(409);
    await dialog.getByText('Already has an account').waitFor();
    expect(await dialog.getByLabel('E-mail address').getAttribute('aria-invalid')).toBe('true');
  });

  it('invites a new person, who then shows as invite pending', async () => {
    const dialog = page.getByRole('dialog', { name: 'Invite someone' });
    await dialog.getByLabel('E-mail address').fill(newcomer.email);
    await dialog.getByLabel('Name').fill(newcomer.name);
    await dialog.getByRole('combobox', { name: 'Role' }).click();
    await page.getByRole('option', { name: 'planner' }).click();
    await dialog.getByRole('button', { name: 'Send invite' }).click();
    await page.getByRole('status').getByText(`The invitation to ${newcomer.email} is on its way.`).waitFor();
    const row = page.getByRole('row', { name: new RegExp(newcomer.name) });
    expect(await row.textContent()).toContain('Invite pending');
    expect(await row.textContent()).toContain('Never');
    expect(await row.getByRole('button', { name: `Resend invite to ${newcomer.name}` }).isVisible()).toBe(true);
    await page.screenshot({ path: resolve(artifacts, 'people.png') });
  });

  it('resends an invite to someone who has not set a password yet', async () => {
    await page.getByRole('button', { name: `Resend invite to ${newcomer.name}` }).click();
    await page.getByRole('status').getByText(`A new invite link to ${newcomer.email} is on its way.`).waitFor();
  });

  it('asks before deactivating, and does nothing on cancel', async () => {
    await page.getByRole('button', { name: `Deactivate ${account('viewer').displayName}` }).click();
    const confirm = page.getByRole('dialog', { name: `Deactivate ${account('viewer').displayName}?` });
    await confirm.getByRole('button', { name: 'Cancel' }).click();
    await confirm.waitFor({ state: 'detached' });
    expect(await page.getByRole('row', { name: new RegExp(account('viewer').displayName) }).textContent()).toContain('Active');
  });

  it('changes a role after confirmation', async () => {
    const name = account('viewer').displayName;
    await page.getByRole('combobox', { name: `Role of ${name}` }).click();
    await page.getByRole('option', { name: 'planner' }).click();
    await page
      .getByRole('dialog', { name: `Make ${name} a planner?` })
      .getByRole('button', { name: 'Change role' })
      .click();
    await page.getByRole('status').getByText(`${name} is now a planner.`).waitFor();
    expect(await page.getByRole('combobox', { name: `Role of ${name}` }).textContent()).toContain('planner');
  });

  it('deactivates and reactivates someone, each after confirmation', async () => {
    const name = account('steward').displayName;
    const row = () => page.getByRole('row', { name: new RegExp(name) });
    await page.getByRole('button', { name: `Deactivate ${name}` }).click();
    await page
      .getByRole('dialog', { name: `Deactivate ${name}?` })
      .getByRole('button', { name: 'Deactivate' })
      .click();
    await page.getByRole('status').getByText(`${name} is deactivated.`).waitFor();
    expect(await row().textContent()).toContain('Deactivated');
    await page.getByRole('button', { name: `Reactivate ${name}` }).click();
    await page
      .getByRole('dialog', { name: `Reactivate ${name}?` })
      .getByRole('button', { name: 'Reactivate' })
      .click();
    await page.getByRole('status').getByText(`${name} is active again.`).waitFor();
    expect(await row().textContent()).toContain('Active');
  });

  let inviteLink: URL;

  it('finds the invitation in the Outbox with its plain-text and sandboxed HTML parts', async () => {
    await navigation().getByRole('link', { name: 'Outbox' }).click();
    // Newest first: the resent invitation, whose link is the one to follow.
    const invitations = page.getByRole('link', { name: new RegExp(`Your Loadwright invitation.*To ${newcomer.email}`) });
    await expect.poll(() => invitations.count()).toBe(2);
    const message = invitations.first();
    await message.click();
    await page.getByRole('heading', { level: 2, name: 'Your Loadwright invitation' }).waitFor();
    const textPart = page.getByRole('region', { name: 'Plain-text part' });
    expect(await textPart.textContent()).toContain(`Hello ${newcomer.name},`);
    const frame = page.locator('iframe.html');
    // Sandboxed without allow-scripts: the message can run nothing.
    expect(await frame.getAttribute('sandbox')).toBe('allow-same-origin');
    expect(await frame.getAttribute('srcdoc')).toContain('Choose a password');
    const html = page.frameLocator('iframe.html');
    const heading = html.getByRole('heading', { name: 'Welcome to Loadwright' });
    await heading.waitFor();
    // The message's own inline styles show, as in the recipient's mail program (#0d5c63 heading).
    await expect.poll(() => heading.evaluate((element) => getComputedStyle(element).color)).toBe('rgb(13, 92, 99)');
    inviteLink = new URL((await textPart.getByRole('link').getAttribute('href'))!);
    expect(inviteLink.pathname).toBe('/set-password');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'outbox.png') });
  });

  it('the link opens the set-password page, which checks the rule and sets the password', async () => {
    await signOutBrowser();
    // The test server's public address has no port; open the same path and token on this server.
    await page.goto(`${server.url}${inviteLink.pathname}${inviteLink.search}`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { level: 1, name: 'Choose a password' }).waitFor();
    await page.getByLabel('New password', { exact: true }).fill('too-short');
    await page.getByLabel('Repeat the new password').fill('too-short');
    await page.getByRole('button', { name: 'Set password' }).click();
    await page.getByText('Use at least 12 characters').last().waitFor();
    await page.getByLabel('New password', { exact: true }).fill(newcomer.password);
    await page.getByLabel('Repeat the new password').fill(newcomer.password);
    await page.getByRole('button', { name: 'Set password' }).click();
    await page.getByRole('status').getByText('Password set. You can sign in now.').waitFor();
  });

  it("the same link used again shows the server's message", async () => {
    await page.goto(`${server.url}${inviteLink.pathname}${inviteLink.search}`, { waitUntil: 'networkidle' });
    await page.getByLabel('New password', { exact: true }).fill(newcomer.password);
    await page.getByLabel('Repeat the new password').fill(newcomer.password);
    await page.getByRole('button', { name: 'Set password' }).click();
    await page.getByRole('alert').getByText('This link has expired or was already used.').waitFor();
  });

  it('the new person signs in as a planner and sees no admin sections', async () => {
    await signInThroughPage(page, server.url, newcomer.email, newcomer.password);
    expect(await accountLink(newcomer.name, 'planner').isVisible()).toBe(true);
    for (const name of adminLinks) expect(await navigation().getByRole('link', { name, exact: true }).count()).toBe(0);
  });

  it("the account page puts the API's refusal of a wrong current password on that field", async () => {
    await page.getByRole('link', { name: /^Your account:/ }).click();
    await page.getByRole('heading', { level: 1, name: 'Your account' }).waitFor();
    await page.getByLabel('Current password').fill('not-my-password');
    await page.getByLabel('New password', { exact: true }).fill('another-long-passphrase');
    await page.getByLabel('Repeat the new password').fill('another-long-passphrase');
    await page.getByRole('button', { name: 'Change password' }).click();
    await page.getByText('Not your current password').waitFor();
    // The error line fades in; axe would measure its contrast half-way. A real contrast fault never clears.
    await expect.poll(async () => blockingViolations(await findAccessibilityViolations(page)), { timeout: 5_000 }).toEqual([]);
  });
});

describe('API tokens and the audit log', () => {
  beforeAll(async () => {
    await signOutBrowser();
    await signInThroughPage(page, server.url, account('admin').email, password, '/api-tokens');
  });

  it('creates a token and shows its secret once, with a copy button and a warning', async () => {
    await page.getByText('A token acts for the admin who created it: it can never do more than that person’s role allows').waitFor();
    await page.getByRole('button', { name: 'Create token' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByText('The token will act for you: if your role changes, it can do only what your new role allows').waitFor();
    await dialog.getByLabel('Name').fill('Dispatch day-ahead pull');
    await dialog.getByRole('radio', { name: /^read-write/ }).check();
    await dialog.getByLabel('Days until it expires').fill('90');
    await dialog.getByRole('button', { name: 'Create token' }).click();
    await dialog.getByText('This is the only time the secret is shown.').waitFor();
    const secret = await dialog.getByLabel(/^Secret/).inputValue();
    expect(secret.length).toBeGreaterThan(20);
    expect(await dialog.getByRole('button', { name: 'Copy' }).isVisible()).toBe(true);
    await page.screenshot({ path: resolve(artifacts, 'api-tokens-secret.png') });
    // The secret is a real token: the API knows it (403 for lacking a person's session, not 401 for an unknown caller).
    const answer = await fetch(`${server.url}/api/auth/session`, { headers: { authorization: `Bearer ${secret}` } });
    expect(answer.status).toBe(403);
    await dialog.getByRole('button', { name: 'I have stored the secret' }).click();
    await dialog.waitFor({ state: 'detached' });
    expect(await page.content()).not.toContain(secret);
    const row = page.getByRole('row', { name: /Dispatch day-ahead pull/ });
    expect(await row.textContent()).toContain('read-write');
    expect(await row.textContent()).toContain('Not yet');
    expect(await row.textContent()).toContain('Ines Calloway');
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
  });

  it('revokes a token after confirmation', async () => {
    await page.getByRole('button', { name: 'Revoke Dispatch day-ahead pull' }).click();
    await page.getByRole('dialog', { name: 'Revoke “Dispatch day-ahead pull”?' }).getByRole('button', { name: 'Revoke token' }).click();
    await page.getByRole('status').getByText('Token “Dispatch day-ahead pull” revoked.').waitFor();
    expect(await page.getByRole('row', { name: /Dispatch day-ahead pull/ }).textContent()).toContain('Revoked');
  });

  it('reads the audit log with readable names and filters it by action family', async () => {
    await navigation().getByRole('link', { name: 'Audit log' }).click();
    const table = page.getByRole('table', { name: 'Audit entries, newest first' });
    await table.waitFor();
    for (const name of ['Revoked an API token', 'Created an API token', 'Invited a person', 'Sign-in failed', 'Signed in']) {
      expect(await table.getByText(name, { exact: true }).count()).toBeGreaterThan(0);
    }
    await page.getByRole('combobox', { name: 'Action' }).click();
    await page.getByRole('option', { name: 'API tokens' }).click();
    await page.getByRole('button', { name: 'Apply' }).click();
    await expect.poll(async () => await table.locator('tbody tr').count()).toBe(2);
    expect(await table.textContent()).not.toContain('Signed in');
    await page.getByRole('button', { name: 'Clear' }).click();
    await expect.poll(async () => await table.locator('tbody tr').count()).toBeGreaterThan(2);
    expect(blockingViolations(await findAccessibilityViolations(page))).toEqual([]);
    await page.screenshot({ path: resolve(artifacts, 'audit-log.png') });
  });

  it('filters by person and by date range', async () => {
    const table = page.getByRole('table', { name: 'Audit entries, newest first' });
    await page.getByRole('combobox', { name: 'Person' }).click();
    await page.getByRole('option', { name: newcomer.name }).click();
    await page.getByRole('button', { name: 'Apply' }).click();
    // Rows while the filtered page loads would pass "every row names them" vacuously: wait for some rows, all theirs.
    await expect
      .poll(async () => {
        const rows = await table.locator('tbody tr').allTextContents();
        return rows.length > 0 && rows.every((row) => row.includes(newcomer.name));
      })
      .toBe(true);
    await page.getByRole('button', { name: 'Clear' }).click();
    // The browser runs in UTC (support/browser.ts), so "today" is the server's date too.
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    await page.getByLabel('From').fill(tomorrow);
    await page.getByRole('button', { name: 'Apply' }).click();
    await page.getByText('No entries match these filters.').waitFor();
    await page.getByRole('button', { name: 'Clear' }).click();
    await table.waitFor();
  });

  it('pages back through older entries', async () => {
    // More entries than one page holds: a burst of failed sign-ins from one documentation address.
    for (let attempt = 0; attempt < AUDIT_PAGE_SIZE + 10; attempt += 1) {
      await recordAudit(server.db, {
        actor: { kind: 'anonymous' },
        action: 'session.sign_in_failed',
        detail: { email: 'nobody@tallowmere.example' },
        ip: '192.0.2.7',
      });
    }
    await page.reload({ waitUntil: 'networkidle' });
    const rows = page.getByRole('table', { name: 'Audit entries, newest first' }).locator('tbody tr');
    await expect.poll(() => rows.count()).toBe(AUDIT_PAGE_SIZE);
    await page.getByRole('button', { name: 'Older entries' }).click();
    await expect.poll(() => rows.count()).toBeGreaterThan(AUDIT_PAGE_SIZE);
    await page.getByText(/entries shown, oldest reached/).waitFor();
  });

  it('made no request that left 127.0.0.1', () => {
    expect(requests.offMachine).toEqual([]);
  });
});

describe('repeated sign-in failures', () => {
  it('make the account wait longer after each failure past three, and the page says how long, even for the right password', async () => {
    await signOutBrowser();
    await page.goto(`${server.url}/sign-in`, { waitUntil: 'networkidle' });
    await page.getByLabel('E-mail address').fill(account('viewer').email);
    const attempt = async (typed: string) => {
      await page.getByLabel('Password', { exact: true }).fill(typed);
      const answer = page.waitForResponse((response) => response.url().endsWith('/api/auth/sign-in'));
      await page.getByRole('button', { name: 'Sign in', exact: true }).click();
      const response = await answer;
      return { status: response.status(), retryAfter: Number((await response.allHeaders())['retry-after'] ?? 0) };
    };
    // Three failures are free; from the fourth each one doubles the wait: 1, 2, 4, 8 s … (apps/api/src/auth/sign-in-throttle.ts).
    for (let failure = 1; failure <= 4; failure += 1) expect((await attempt(`wrong-guess-${failure}`)).status).toBe(401);
    // Keep guessing as someone would, letting short waits pass, until a wait of at least 4 s is announced.
    let answer = await attempt('wrong-guess-5');
    for (let guess = 6; answer.status !== 429 || answer.retryAfter < 4; guess += 1) {
      expect(guess).toBeLessThan(12);
      if (answer.status === 429) await page.waitForTimeout(answer.retryAfter * 1000);
      answer = await attempt(`wrong-guess-${guess}`);
    }
    await page
      .getByRole('alert')
      .getByText(new RegExp(`^Too many failed sign-ins\\. Try again in ${answer.retryAfter} seconds, or reset your password\\.$`))
      .waitFor();
    expect((await attempt(password)).status).toBe(429);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
  });
});
