/** `GET /api/me/inbox`: what waits for the signed-in person, each list newest first (at most 20). */
export interface InboxItem {
  team: { id: string; name: string };
  pack: { slug: string; name: string };
  version: number;
  /** A version's state (proposed | changes-requested | approved); for a release, the channel moved. */
  state: string;
  /** For a release, the channel name; otherwise null. */
  channel: string | null;
  /** Who proposed (reviews to do) or who released (releases); null for one's own proposals or a removed account. */
  by: string | null;
  /** ISO time: proposed (reviews, proposals; a proposal's latest review when reviewed) or moved (releases). */
  at: string;
  /** Client path of the version page (the current team must be `team.id`). */
  path: string;
}
export interface InboxDto {
  reviewsToDo: InboxItem[];
  myProposals: InboxItem[];
  recentReleases: InboxItem[];
  /** Per list: older items exist beyond the 20 shown. */
  more: { reviewsToDo: boolean; myProposals: boolean; recentReleases: boolean };
}
