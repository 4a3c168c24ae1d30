/**
 * What happened in a team, told once to everyone who cares (the activity log, in-app notifications,
 * webhooks). A route publishes an event after its change is committed; each subscriber is awaited but
 * isolated: a subscriber that throws is logged and never fails the action that published the event.
 *
 * Subscribers are registered once per process in ./subscribers.ts, so the API processes and the bake
 * worker (which publishes `version.proposed` when a background bake finishes) behave the same.
 */
import type { Logger } from 'pino';

export type TeamEventType =
  | 'pack.created' | 'pack.updated' | 'pack.archived' | 'pack.restored'
  | 'curve.created' | 'curve.saved' | 'curve.deleted' | 'curve.moved' | 'curve.copied' | 'curves.reordered' | 'curves.uploaded'
  | 'profile.created' | 'profile.updated' | 'profile.deleted'
  | 'version.proposed' | 'version.bake-failed' | 'version.approved' | 'version.changes-requested' | 'version.commented'
  | 'channel.moved';

export interface TeamEvent {
  type: TeamEventType;
  teamId: string;
  /** The person who acted; null for the system (a background bake) or a service token. */
  actorId: string | null;
  /** The pack the event concerns, when it concerns one. */
  pack?: { id: string; slug: string; name: string };
  /** What was acted on, in words a person reads in the activity table ("v3", "ease-out-dock", "Mobile", "shipping"). */
  subject: { kind: 'pack' | 'curve' | 'version' | 'profile' | 'channel'; id?: string; label: string };
  /** Event-specific details (version number, channel's previous version, comment id…), JSON-serialisable. */
  data: Record<string, unknown>;
  at: Date;
}

export type TeamEventSubscriber = (event: TeamEvent) => Promise<void> | void;

export class TeamEvents {
  private readonly subscribers: { name: string; fn: TeamEventSubscriber }[] = [];

  constructor(private readonly logger: Logger) {}

  subscribe(name: string, fn: TeamEventSubscriber): void {
    this.subscribers.push({ name, fn });
  }

  async publish(event: Omit<TeamEvent, 'at'> & { at?: Date }): Promise<void> {
    const full: TeamEvent = { ...event, at: event.at ?? new Date() };
    await Promise.all(this.subscribers.map(async (s) => {
      try {
        await s.fn(full);
      } catch (err) {
        this.logger.error({ err: (err as Error).message, subscriber: s.name, event: full.type }, 'team event subscriber failed');
      }
    }));
  }
}
