/**
 * Demo accounts of the embedded default (config.demoAccounts): one per role at <role>@corvid-lantern.test
 * (RFC 2606 reserves .test, so no real mailbox can receive them). Fictional people of the brief's
 * fictional studio. The password is documented in the README and printed by `npm start`.
 */
import type { Role } from '../../shared/schemas/roles';

export const DEMO_PASSWORD = 'tidewright-demo';

export interface DemoAccount {
  role: Role;
  email: string;
  name: string;
  /** team slug → role there */
  teams: Record<string, Role>;
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { role: 'admin', email: 'admin@corvid-lantern.test', name: 'Wren Halloway', teams: { 'ui-motion': 'admin', 'gameplay-feel': 'admin' } },
  { role: 'lead', email: 'lead@corvid-lantern.test', name: 'Tamsin Okafor', teams: { 'ui-motion': 'lead', 'gameplay-feel': 'lead' } },
  { role: 'animator', email: 'animator@corvid-lantern.test', name: 'Pell Marchetti', teams: { 'ui-motion': 'animator', 'gameplay-feel': 'viewer' } },
  { role: 'engineer', email: 'engineer@corvid-lantern.test', name: 'Ines Varga', teams: { 'gameplay-feel': 'engineer', 'ui-motion': 'engineer' } },
  { role: 'viewer', email: 'viewer@corvid-lantern.test', name: 'Bram Oduya', teams: { 'ui-motion': 'viewer' } },
];
