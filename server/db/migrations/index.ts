import type { MigrationContext } from '../migrate';
import * as m0001 from './0001-studios-and-teams';
import * as m0002 from './0002-accounts';
import * as m0003 from './0003-target-profiles';
import * as m0004 from './0004-packs-and-curves';
import * as m0005 from './0005-pack-versions';
import * as m0006 from './0006-version-reviews';
import * as m0007 from './0007-channels';
import * as m0008 from './0008-webhooks';
import * as m0009 from './0009-background-bakes';
import * as m0010 from './0010-activity-and-comments';
import * as m0011 from './0011-mail-outbox';
import * as m0012 from './0012-rate-limits';

export interface Migration {
  name: string;
  up(ctx: MigrationContext): Promise<void>;
  down(ctx: MigrationContext): Promise<void>;
}

/** Every migration in order. Add new ones at the end; never edit one that has shipped. */
export const migrations: Migration[] = [
  { name: '0001-studios-and-teams', ...m0001 },
  { name: '0002-accounts', ...m0002 },
  { name: '0003-target-profiles', ...m0003 },
  { name: '0004-packs-and-curves', ...m0004 },
  { name: '0005-pack-versions', ...m0005 },
  { name: '0006-version-reviews', ...m0006 },
  { name: '0007-channels', ...m0007 },
  { name: '0008-webhooks', ...m0008 },
  { name: '0009-background-bakes', ...m0009 },
  { name: '0010-activity-and-comments', ...m0010 },
  { name: '0011-mail-outbox', ...m0011 },
  { name: '0012-rate-limits', ...m0012 },
];
