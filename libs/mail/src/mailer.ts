/** Sends mail through nodemailer over SMTP: a real server from SMTP_URL, or the local catcher. */
import nodemailer from 'nodemailer';

/** A message with both a plain-text and an HTML part, as every Loadwright message has. */
export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** Anything that can send a message. */
export interface Mailer {
  send(message: MailMessage): Promise<void>;
}

/** A mailer on an SMTP URL such as smtp://127.0.0.1:2525. */
export function createMailer(smtpUrl: string, from: string): Mailer {
  const transport = nodemailer.createTransport(smtpUrl);
  return {
    async send(message) {
      await transport.sendMail({ from, ...message });
    },
  };
}
