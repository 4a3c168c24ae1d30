import { useEffect } from 'react';
import { Card } from '../components/card';
import { FormAlert, secondaryButton } from '../components/form-controls';
import { formMessage } from '../lib/form-errors';
import { useCurrentTeam } from '../app/use-current-team';
import { useMarkRead, useNoticePages } from '../features/notifications/api/notices';
import { NoticeList } from '../features/notifications/components/notice-list';
import { RequireSignIn } from './require-sign-in';

function Notices() {
  const { setTeamId } = useCurrentTeam();
  const pages = useNoticePages();
  const mark = useMarkRead();
  const notices = pages.data?.pages.flatMap((p) => p.notices) ?? [];
  const unreadShown = notices.filter((n) => !n.readAt).map((n) => n.id).join(',');
  // opening the page reads what it shows
  useEffect(() => {
    if (unreadShown) mark.mutate({ ids: unreadShown.split(',') });
  }, [unreadShown]);
  if (pages.isPending) return <p className="text-sm">Loading…</p>;
  if (pages.isError) return <FormAlert message={formMessage(pages.error)} />;
  return (
    <Card className="p-4">
      <NoticeList notices={notices} onFollow={(n) => setTeamId(n.team.id)} />
      {pages.hasNextPage ? (
        <button type="button" className={`${secondaryButton} mt-3`} disabled={pages.isFetchingNextPage} onClick={() => pages.fetchNextPage()}>Older</button>
      ) : null}
    </Card>
  );
}

/** /notices: every in-app notice of the signed-in person, newest first. */
export function NoticesPage() {
  return (
    <RequireSignIn>
      {() => (
        <div>
          <title>Notices · Tangentry</title>
          <h1 className="text-2xl font-semibold tracking-tight">Notices</h1>
          <p className="mt-2 max-w-prose text-sm">Reviews and comments on your proposals, versions waiting for your review, failed bakes.</p>
          <div className="mt-6"><Notices /></div>
        </div>
      )}
    </RequireSignIn>
  );
}
