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

/** The caution every forecast-related message carries. */
export const decisionSupportCaution =
  "Forecasts are decision support. Operating, switching and reliability decisions follow the utility's procedures, the applicable reliability rules and local codes, and rest with licensed or authorised operators.";

/** One missed hour as a message shows it, already in the series' local time and unit. */
export interface MissHourLine {
  time: string;
  actual: string;
  forecast: string;
  band: string;
  error: string;
}

/** What a miss message says about one miss. */
export interface MissMailView {
  severity: 'low' | 'medium' | 'high';
  seriesName: string;
  ruleName: string;
  /** The period in the series' local time, e.g. "Tue 3 Nov 14:00–17:00 CST". */
  period: string;
  summary: string;
  cause: string | null;
  hours: MissHourLine[];
  link: string;
}

const severityWord = { low: 'Low', medium: 'Medium', high: 'High' } as const;

function hourTable(hours: MissHourLine[]): string {
  if (hours.length === 0) return '';
  const cell = 'style="padding:4px 8px;border-bottom:1px solid #d5dde2;text-align:right"';
  const rows = hours
    .slice(0, 24)
    .map(
      (h) =>
        `<tr><td ${cell.replace('right', 'left')}>${escapeHtml(h.time)}</td><td ${cell}>${escapeHtml(h.actual)}</td><td ${cell}>${escapeHtml(h.forecast)}</td><td ${cell}>${escapeHtml(h.band)}</td><td ${cell}>${escapeHtml(h.error)}</td></tr>`,
    )
    .join('');
  return `<table style="border-collapse:collapse;font-size:14px;margin:0 0 12px"><thead><tr><th ${cell.replace('right', 'left')}>Hour</th><th ${cell}>Actual</th><th ${cell}>Forecast</th><th ${cell}>95 % band</th><th ${cell}>Error</th></tr></thead><tbody>${rows}</tbody></table>`;
}

function hourText(hours: MissHourLine[]): string {
  return hours
    .slice(0, 24)
    .map((h) => `  ${h.time}: actual ${h.actual}, forecast ${h.forecast}, band ${h.band}, error ${h.error}`)
    .join('\n');
}

/** One miss, e-mailed at once (high severity, or to people who want every miss at once). */
export function missAlertMessage(to: string, miss: MissMailView): MailMessage {
  const subject = `${severityWord[miss.severity]}: ${miss.seriesName} — ${miss.ruleName.toLowerCase()}, ${miss.period}`;
  const lines = [
    `${miss.seriesName}: ${miss.summary}`,
    `Period: ${miss.period}. Rule: ${miss.ruleName} (${miss.severity} severity).`,
    miss.cause ? `Likely cause: ${miss.cause}` : 'Likely cause: not known yet.',
  ];
  const text = `${lines.join('\n\n')}\n\n${hourText(miss.hours)}\n\nOpen the miss: ${miss.link}\n\n${decisionSupportCaution}\n`;
  const body = lines.map((p) => `<p style="margin:0 0 12px">${escapeHtml(p)}</p>`).join('') + hourTable(miss.hours);
  const html = `<!doctype html><html><body style="font-family:'Source Sans 3',Arial,sans-serif;color:#1d2a33;max-width:640px">
<h1 style="font-size:20px;color:#0d5c63">${escapeHtml(subject)}</h1>${body}
<p><a href="${escapeHtml(miss.link)}" style="background:#0d5c63;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Open the miss</a></p>
<p style="font-size:12px;color:#5b6770">${escapeHtml(decisionSupportCaution)}</p>
</body></html>`;
  return { to, subject, text, html };
}

/** The daily digest: every miss of the last day a person gets by digest, one paragraph each. */
export function missDigestMessage(to: string, date: string, misses: MissMailView[]): MailMessage {
  const highs = misses.filter((m) => m.severity === 'high').length;
  const subject = `Loadwright daily misses, ${date}: ${misses.length} ${misses.length === 1 ? 'miss' : 'misses'}${highs ? `, ${highs} high` : ''}`;
  const text =
    misses
      .map(
        (m) =>
          `${severityWord[m.severity]} — ${m.seriesName}, ${m.period}\n  ${m.summary}\n  Likely cause: ${m.cause ?? 'not known yet.'}\n  ${m.link}`,
      )
      .join('\n\n') + `\n\n${decisionSupportCaution}\n`;
  const items = misses
    .map(
      (m) =>
        `<li style="margin:0 0 12px"><strong>${escapeHtml(severityWord[m.severity])} — ${escapeHtml(m.seriesName)}</strong>, ${escapeHtml(m.period)}<br>${escapeHtml(m.summary)}<br>Likely cause: ${escapeHtml(m.cause ?? 'not known yet.')}<br><a href="${escapeHtml(m.link)}">Open the miss</a></li>`,
    )
    .join('');
  const html = `<!doctype html><html><body style="font-family:'Source Sans 3',Arial,sans-serif;color:#1d2a33;max-width:640px">
<h1 style="font-size:20px;color:#0d5c63">${escapeHtml(subject)}</h1><ul style="padding-left:18px">${items}</ul>
<p style="font-size:12px;color:#5b6770">${escapeHtml(decisionSupportCaution)}</p></body></html>`;
  return { to, subject, text, html };
}
