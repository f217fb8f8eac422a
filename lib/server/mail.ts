/**
 * Outgoing mail over SMTP (nodemailer). Production sets SMTP_HOST/PORT/USER/PASS/FROM; development
 * and tests point SMTP_HOST at the local mail fake, which keeps every message in mail_messages.
 */
import nodemailer, { type Transporter } from 'nodemailer';

const g = globalThis as unknown as { __tauforgeMail?: Transporter };

function transport(): Transporter {
  if (!g.__tauforgeMail) {
    const port = Number(process.env.SMTP_PORT ?? 2525);
    const user = process.env.SMTP_USER;
    g.__tauforgeMail = nodemailer.createTransport({
      host: process.env.SMTP_HOST ?? '127.0.0.1',
      port,
      secure: port === 465,
      // The local fake speaks plain SMTP on loopback; a real relay negotiates STARTTLS.
      ignoreTLS: process.env.TAUFORGE_MAIL_FAKE === '1',
      auth: user ? { user, pass: process.env.SMTP_PASS ?? '' } : undefined,
    });
  }
  return g.__tauforgeMail;
}

export function siteUrl(path = ''): string {
  const base = (process.env.NEXTAUTH_URL ?? 'http://127.0.0.1:3000').replace(/\/$/, '');
  return base + path;
}

export async function sendMail(to: string, subject: string, text: string): Promise<void> {
  await transport().sendMail({
    from: process.env.SMTP_FROM ?? 'Tauforge <no-reply@tauforge.invalid>',
    to,
    subject,
    text,
  });
}
