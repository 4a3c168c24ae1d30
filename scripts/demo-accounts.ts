/** How to sign in to the embedded demo (printed by npm start; the README says the same). */
import { DEMO_ACCOUNTS, DEMO_PASSWORD } from '../server/seed/demo-accounts';

export const DEMO_PASSWORD_NOTE = [
  'Demo scenario: Corvid Lantern Games (fictional), teams "UI Motion" and "Gameplay Feel".',
  `Demo accounts (embedded default only), password "${DEMO_PASSWORD}":`,
  ...DEMO_ACCOUNTS.map((a) => `  ${a.email.padEnd(30)} ${Object.entries(a.teams).map(([t, r]) => `${r} in ${t}`).join(', ')}`),
].join('\n');
