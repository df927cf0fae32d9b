/** The words of the messages Loadwright sends, each as plain text and HTML. */
import type { MailMessage } from './mailer';

const escapeHtml = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function layout(title: string, paragraphs: string[], link: { href: string; label: string }): string {
  const body = paragraphs.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join('');
  return `<!doctype html><html><body style="font-family:'Source Sans 3',Arial,sans-serif;color:#1d2a33;max-width:560px">
<h1 style="font-size:20px;color:#0d5c63">${escapeHtml(title)}</h1>${body}
<p><a href="${escapeHtml(link.href)}" style="background:#0d5c63;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p>
<p style="font-size:12px;color:#5b6770">If the button does not work, copy this address into your browser: ${escapeHtml(link.href)}</p>
</body></html>`;
}

/** An invitation with its one-time set-password link. */
export function inviteMessage(to: string, displayName: string, invitedBy: string, link: string, expiresHours: number): MailMessage {
  const paragraphs = [
    `Hello ${displayName},`,
    `${invitedBy} invited you to Loadwright, your team's load forecasting workspace. Choose a password to sign in.`,
    `The link works once and expires in ${expiresHours} hours.`,
  ];
  return {
    to,
    subject: 'Your Loadwright invitation',
    text: `${paragraphs.join('\n\n')}\n\n${link}\n`,
    html: layout('Welcome to Loadwright', paragraphs, { href: link, label: 'Choose a password' }),
  };
}

/** A password reset link. */
export function passwordResetMessage(to: string, displayName: string, link: string, expiresMinutes: number): MailMessage {
  const paragraphs = [
    `Hello ${displayName},`,
    `Someone asked to reset your Loadwright password. If it was you, choose a new one with the link below; otherwise ignore this message and your password stays as it is.`,
    `The link works once and expires in ${expiresMinutes} minutes.`,
  ];
  return {
    to,
    subject: 'Reset your Loadwright password',
    text: `${paragraphs.join('\n\n')}\n\n${link}\n`,
    html: layout('Reset your password', paragraphs, { href: link, label: 'Choose a new password' }),
  };
}
