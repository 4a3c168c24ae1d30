import type { AppContext } from '../context';

/**
 * Everyone who listens to team events, one line each (activity log, notifications, webhooks).
 * Called once by createContext(), in the API processes and in the bake worker alike.
 */
export function registerSubscribers(_ctx: AppContext): void {
}
