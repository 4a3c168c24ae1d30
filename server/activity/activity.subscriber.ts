/**
 * Records every team event as a row of the team's activity table. Registered once per process in
 * server/events/subscribers.ts, so events published by the bake worker are recorded too.
 */
import type { AppContext } from '../context';
import type { TeamEventType } from '../events/team-events';
import type { ActivityType } from '../../shared/schemas/activity';
import { insertActivity } from './activity.repository';

// the shared list of types (for the filter) and the server's event union must name the same types
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : never) : never;
const typesAgree: Same<TeamEventType, ActivityType> = true;
void typesAgree;

export function registerActivitySubscriber(ctx: AppContext): void {
  ctx.events.subscribe('activity', (event) => insertActivity(event));
}
