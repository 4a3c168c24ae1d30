import { HeadBucketCommand } from '@aws-sdk/client-s3';
import type { AppContext } from '../context';

export type PartState = 'up' | 'down';
export interface Health {
  status: 'ok' | 'degraded';
  database: PartState;
  storage: PartState;
  mail: PartState;
  problems?: Partial<Record<'database' | 'storage' | 'mail', string>>;
}

function withTimeout<T>(p: Promise<T>, ms: number, what: string): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${what} did not answer within ${ms} ms`)), ms);
    p.then(
      (v) => (clearTimeout(timer), resolve(v)),
      (e) => (clearTimeout(timer), reject(e)),
    );
  });
}

/** Real checks: a query, a bucket head, an SMTP connection (EHLO) — each bounded in time. */
export async function checkHealth(ctx: AppContext, timeoutMs = 3_000): Promise<Health> {
  const problems: Health['problems'] = {};
  const check = async (part: 'database' | 'storage' | 'mail', fn: () => Promise<unknown>): Promise<PartState> => {
    try {
      await withTimeout(fn(), timeoutMs, part);
      return 'up';
    } catch (err) {
      problems[part] = (err as Error).message || String(err);
      return 'down';
    }
  };
  const [database, storage, mail] = await Promise.all([
    check('database', () => ctx.sequelize.query('SELECT 1')),
    check('storage', () => ctx.s3.send(new HeadBucketCommand({ Bucket: ctx.config.s3.bucket }))),
    check('mail', async () => {
      if (!ctx.mail) throw new Error('no SMTP_URL configured');
      await ctx.mail.verify();
    }),
  ]);
  const ok = database === 'up' && storage === 'up' && mail === 'up';
  return { status: ok ? 'ok' : 'degraded', database, storage, mail, ...(ok ? {} : { problems }) };
}
