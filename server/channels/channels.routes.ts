import { Router } from 'express';
import type { AppContext } from '../context';
import { requireTeam, requireUser } from '../auth/require-role';
import { principalOf, teamAccessOf } from '../auth/principal';
import { validateBody } from '../http/validate';
import { badRequest } from '../http/errors';
import { channelNameSchema, releaseSchema } from '../../shared/schemas/channels';
import * as channels from './channels.service';
import { getPack } from '../packs/packs.service';

/** Channels of a pack: every member and the team's tokens read; leads and admins (channels.release) move them. */
export function channelRoutes(ctx: AppContext): Router {
  const router = Router();
  const base = '/teams/:teamId/packs/:pack/channels';

  // GET …/channels → { channels: [{ name, version, history }] }
  router.get(base, requireTeam('team.read'), async (req, res) => {
    res.json({ channels: await channels.listChannels(principalOf(res), teamAccessOf(res).teamId, String(req.params.pack)) });
  });

  // PUT …/channels/:channel { version } → { channel } (a release; 409 not_approved)
  router.put(`${base}/:channel`, requireUser(), requireTeam('channels.release'), validateBody(releaseSchema), async (req, res) => {
    const p = principalOf(res);
    if (p.kind !== 'user') throw new Error('unreachable: requireUser lets only people through');
    const parsed = channelNameSchema.safeParse(String(req.params.channel));
    if (!parsed.success) throw badRequest(parsed.error.issues[0]!.message, { channel: parsed.error.issues[0]!.message });
    const name = parsed.data;
    const teamId = teamAccessOf(res).teamId;
    const before = (await channels.listChannels(p, teamId, String(req.params.pack))).find((c) => c.name === name)?.version ?? null;
    const channel = await channels.release(p, teamId, String(req.params.pack), name, req.body.version, p.user.id);
    if (before !== channel.version) {
      const pack = await getPack(p, teamId, String(req.params.pack));
      await ctx.events.publish({
        type: 'channel.moved', teamId, actorId: p.user.id, pack: { id: pack.id, slug: pack.slug, name: pack.name },
        subject: { kind: 'channel', label: name }, data: { channel: name, from: before, to: channel.version },
      });
    }
    res.json({ channel });
  });

  return router;
}
