/**
 * Tells the proposer of a version that a lead reviewed it (the embedded default sends to the local mail
 * catcher, readable on /outbox). The review is already stored: a mail failure is logged, not an error.
 */
import type { AppContext } from '../context';
import { sendMail } from '../auth/auth-mail';
import type { VersionDto } from '../../shared/schemas/versions';
import { emailOf } from './versions.repository';

export async function notifyProposer(ctx: AppContext, slug: string, v: VersionDto, reviewerId: string): Promise<void> {
  const review = v.reviews[v.reviews.length - 1];
  if (!review || !v.proposedBy || v.proposedBy.id === reviewerId) return;
  try {
    const to = await emailOf(v.proposedBy.id);
    if (!to) return;
    const what = review.decision === 'approve' ? 'approved' : 'asked for changes to';
    await sendMail(ctx, {
      to,
      subject: `${review.reviewer?.name ?? 'A lead'} ${what} v${v.number} of ${slug}`,
      lines: [
        `${review.reviewer?.name ?? 'A lead'} ${what} v${v.number} of the pack "${slug}" (${v.changelog}).`,
        ...(review.comment ? [`Comment: ${review.comment}`] : []),
      ],
      link: `${ctx.config.publicUrl}/packs/${encodeURIComponent(slug)}/versions/${v.number}`,
      linkLabel: 'Open the version',
    });
  } catch (err) {
    ctx.logger.warn({ err: (err as Error).message, slug, version: v.number }, 'review notification not sent');
  }
}
