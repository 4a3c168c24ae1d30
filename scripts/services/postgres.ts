/**
 * A PostgreSQL 15 cluster of our own under a data folder, on 127.0.0.1 and its
 * own port, with the socket inside the data folder. initdb refuses to run as
 * root, so when we are root the folder is handed to the `postgres` user and the
 * binaries run through `runuser -u postgres --`.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { chownSync, existsSync, mkdirSync } from 'node:fs';
import { resolve } from 'node:path';
import pg from 'pg';
import { freePort } from './free-port';

const BIN = '/usr/lib/postgresql/15/bin';
const SUPERUSER = 'tangentry';

export interface EmbeddedPostgres {
  url(database?: string): string;
  port: number;
  dataDir: string;
  stop(): void;
}

function asPostgresUser(cmd: string, args: string[]): string[] {
  const root = typeof process.getuid === 'function' && process.getuid() === 0;
  return root ? ['runuser', '-u', 'postgres', '--', cmd, ...args] : [cmd, ...args];
}

function run(cmd: string, args: string[]): void {
  const [bin, ...rest] = asPostgresUser(cmd, args);
  const r = spawnSync(bin!, rest, { encoding: 'utf8' });
  if (r.status !== 0) {
    throw new Error(`${cmd} failed (exit ${r.status}): ${r.stderr || r.stdout}`);
  }
}

function postgresUid(): { uid: number; gid: number } | null {
  if (typeof process.getuid !== 'function' || process.getuid() !== 0) return null;
  const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim());
  const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim());
  return { uid, gid };
}

/**
 * Create the cluster on first use, then start it. `database` is created when
 * missing. Returns a handle whose stop() is synchronous so it can run in exit hooks.
 */
export async function startEmbeddedPostgres(opts: {
  dataDir: string;
  port?: number;
  database: string;
  /** Throwaway clusters (tests) skip fsync; a kept cluster never does. */
  throwaway?: boolean;
}): Promise<EmbeddedPostgres> {
  if (!existsSync(`${BIN}/initdb`)) {
    throw new Error(`PostgreSQL 15 binaries not found in ${BIN}; install the Debian package postgresql-15.`);
  }
  const dataDir = resolve(opts.dataDir);
  const owner = postgresUid();
  if (!existsSync(`${dataDir}/PG_VERSION`)) {
    mkdirSync(dataDir, { recursive: true });
    if (owner) chownSync(dataDir, owner.uid, owner.gid);
    run(`${BIN}/initdb`, ['-D', dataDir, '-U', SUPERUSER, '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
  }
  const port = opts.port ?? (await freePort());
  const logFile = `${dataDir}/server.log`;
  // a stale postmaster.pid from a killed run would block the start
  const pidFile = `${dataDir}/postmaster.pid`;
  if (existsSync(pidFile)) {
    const [bin, ...args] = asPostgresUser(`${BIN}/pg_ctl`, ['status', '-D', dataDir]);
    if (spawnSync(bin!, args).status === 0) run(`${BIN}/pg_ctl`, ['stop', '-D', dataDir, '-m', 'fast', '-w']);
  }
  run(`${BIN}/pg_ctl`, [
    'start', '-D', dataDir, '-w', '-t', '60', '-l', logFile,
    '-o', `-h 127.0.0.1 -p ${port} -k ${dataDir} -c max_connections=200${opts.throwaway ? ' -c fsync=off -c full_page_writes=off' : ''}`,
  ]);
  const url = (db = opts.database) => `postgres://${SUPERUSER}@127.0.0.1:${port}/${db}`;
  const admin = new pg.Client({ connectionString: url('postgres') });
  await admin.connect();
  try {
    const found = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [opts.database]);
    if (found.rowCount === 0) await admin.query(`CREATE DATABASE "${opts.database.replace(/"/g, '')}"`);
  } finally {
    await admin.end();
  }
  let stopped = false;
  return {
    url,
    port,
    dataDir,
    stop() {
      if (stopped) return;
      stopped = true;
      try {
        run(`${BIN}/pg_ctl`, ['stop', '-D', dataDir, '-m', 'fast', '-w']);
      } catch (err) {
        console.error(`PostgreSQL stop: ${(err as Error).message}`);
      }
    },
  };
}
