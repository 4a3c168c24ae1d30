import { Router } from 'express';
import type { AppContext } from '../context';
import { requireRoleAnywhere } from '../auth/require-role';
import { notFound } from '../http/errors';
import { readCaughtMessages } from '../../storage-fake/mail-catcher';

const LINK = /https?:\/\/[^\s<>"')]+/g;

export function outboxRoutes(ctx: AppContext): Router {
  const router = Router();

  // GET /api/outbox → admin of any team; the mail catcher's messages (embedded default only; 404 otherwise)
  router.get('/outbox', requireRoleAnywhere('outbox.read'), (_req, res) => {
    const dir = ctx.config.mailCatcherDir;
    if (!dir) throw notFound('There is no outbox: mail goes to a real SMTP server (SMTP_URL).');
    res.set('Cache-Control', 'no-store');
    const messages = readCaughtMessages(dir)
      .slice(0, 200)
      .map((m) => ({ id: m.id, receivedAt: m.receivedAt, from: m.from, to: m.to, subject: m.subject, text: m.text, links: [...new Set(m.text.match(LINK) ?? [])] }));
    res.json({ messages });
  });

  return router;
}
