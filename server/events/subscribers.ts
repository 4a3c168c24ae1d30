import type { AppContext } from '../context';
import { registerActivitySubscriber } from '../activity/activity.subscriber';
import { registerNotificationSubscriber } from '../notifications/notifications.subscriber';
import { registerWebhookSubscriber } from '../webhooks/subscriber';

/**
 * Everyone who listens to team events, one line each (activity log, notifications, webhooks).
 * Called once by createContext(), in the API processes and in the bake worker alike.
 */
export function registerSubscribers(_ctx: AppContext): void {
  registerActivitySubscriber(_ctx);
  registerNotificationSubscriber(_ctx);
  registerWebhookSubscriber(_ctx);
}
