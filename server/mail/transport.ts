import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../config';

/** The SMTP transport: the local catcher in the embedded default, the studio's relay when SMTP_URL is set. */
export function createMailTransport(config: Pick<Config, 'smtpUrl'>): Transporter | null {
  if (!config.smtpUrl) return null;
  const url = new URL(config.smtpUrl);
  return nodemailer.createTransport({
    host: url.hostname,
    port: Number(url.port) || (url.protocol === 'smtps:' ? 465 : 587),
    secure: url.protocol === 'smtps:',
    auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
    connectionTimeout: 5_000,
    greetingTimeout: 5_000,
    socketTimeout: 10_000,
  });
}
