/**
 * The two messages accounts send, as plain text and simple HTML. Links point at config.publicUrl.
 * sendMail stores the message in the mail outbox (server/mail/outbox.ts) and returns: delivery, and
 * retries while the mail server is down, happen from there.
 */
import type { AppContext } from '../context';
import { queueMail } from '../mail/outbox';

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export async function sendMail(ctx: AppContext, msg: { to: string; subject: string; lines: string[]; link: string; linkLabel: string }): Promise<void> {
  if (!ctx.mail) throw new Error('No SMTP transport is configured (SMTP_URL).');
  const text = [...msg.lines, '', `${msg.linkLabel}: ${msg.link}`, '', '— Tangentry'].join('\n');
  const html = `${msg.lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('')}<p><a href="${escapeHtml(msg.link)}">${escapeHtml(msg.linkLabel)}</a></p><p>— Tangentry</p>`;
  await queueMail(ctx, { to: msg.to, subject: msg.subject, text, html });
}

export function invitationMail(ctx: AppContext, m: { to: string; inviter: string; teamName: string; studioName: string; role: string; token: string; expiresAt: Date }) {
  return sendMail(ctx, {
    to: m.to,
    subject: `You are invited to ${m.teamName} on Tangentry`,
    lines: [
      `${m.inviter} invited you to the team "${m.teamName}" of ${m.studioName} as ${m.role}.`,
      `The link works once and until ${m.expiresAt.toUTCString()}.`,
    ],
    link: `${ctx.config.publicUrl}/invite/${m.token}`,
    linkLabel: 'Accept the invitation',
  });
}

export function resetMail(ctx: AppContext, m: { to: string; token: string; minutes: number }) {
  return sendMail(ctx, {
    to: m.to,
    subject: 'Reset your Tangentry password',
    lines: [
      'Someone asked to reset the password of this Tangentry account. If it was not you, ignore this message.',
      `The link works once and for ${m.minutes} minutes.`,
    ],
    link: `${ctx.config.publicUrl}/reset-password/${m.token}`,
    linkLabel: 'Choose a new password',
  });
}
