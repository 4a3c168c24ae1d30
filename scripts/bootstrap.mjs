#!/usr/bin/env node
// One entry for `npm start`, `npm run dev`, `npm test` and `npm run worker`.
// It installs what a fresh machine lacks (npm packages, Debian's PostgreSQL and,
// for tests, Chromium), then hands over to the TypeScript entry for the mode.
// Plain JavaScript on purpose: it must run before node_modules exists.
import { spawnSync, spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const mode = process.argv[2] ?? 'start';
const entries = {
  start: 'scripts/start.ts',
  dev: 'scripts/start.ts',
  worker: 'scripts/worker.ts',
  test: 'scripts/test-run.ts',
};
if (!(mode in entries)) {
  console.error(`Unknown mode "${mode}". Use one of: ${Object.keys(entries).join(', ')}.`);
  process.exit(2);
}

const PG_BIN = '/usr/lib/postgresql/15/bin';

function run(cmd, args, opts = {}) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', cwd: root, ...opts });
  return r.status === 0;
}

function isRoot() {
  return typeof process.getuid === 'function' && process.getuid() === 0;
}

let aptUpdated = false;
function aptInstall(packages, why) {
  if (!isRoot()) {
    console.error(
      `Tangentry needs ${packages.join(', ')} (${why}) and cannot install ${packages.length > 1 ? 'them' : 'it'} ` +
        `without root. Install with: sudo apt-get install -y ${packages.join(' ')}`,
    );
    process.exit(1);
  }
  console.log(`Installing Debian packages: ${packages.join(', ')} (${why}) …`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (!aptUpdated) {
    run('apt-get', ['update', '-qq'], { env });
    aptUpdated = true;
  }
  if (!run('apt-get', ['install', '-y', '-qq', '--no-install-recommends', ...packages], { env })) {
    console.error(`apt-get could not install ${packages.join(', ')}. Install ${packages.length > 1 ? 'them' : 'it'} by hand and retry.`);
    process.exit(1);
  }
}

// 1. npm packages
if (!existsSync(join(root, 'node_modules', '.bin', 'tsx'))) {
  console.log('node_modules is missing: running npm ci …');
  if (!run('npm', ['ci', '--no-audit', '--no-fund'])) {
    console.error('npm ci failed; see the output above.');
    process.exit(1);
  }
}

// 2. PostgreSQL binaries, unless a managed database is configured (tests always use their own cluster)
const needsPostgres = mode === 'test' || !process.env.DATABASE_URL;
if (needsPostgres && !existsSync(join(PG_BIN, 'initdb'))) {
  aptInstall(['postgresql-15'], 'the embedded database');
}

// 3. Chromium for the end-to-end suite
if (mode === 'test' && !existsSync('/usr/bin/chromium')) {
  aptInstall(['chromium'], 'the end-to-end browser tests');
}

// 4. Hand over to the TypeScript entry; forward signals so everything started is stopped.
const child = spawn(join(root, 'node_modules', '.bin', 'tsx'), [entries[mode], ...process.argv.slice(3)], {
  cwd: root,
  stdio: 'inherit',
  // The pinned AWS SDK still supports Node 20; its notice about future versions is noise in every log.
  env: { AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true', ...process.env, TANGENTRY_MODE: mode },
});
for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(sig, () => child.kill(sig));
}
// npm runs this through `sh -c`; a SIGTERM sent to npm alone (a process manager, `timeout npm start`) ends npm and
// that shell without passing it on, which would leave this process and PostgreSQL running with no parent. When the
// parent goes away, stop as if told to.
const parent = process.ppid;
const orphanWatch = setInterval(() => {
  if (process.ppid !== parent) {
    clearInterval(orphanWatch);
    child.kill('SIGTERM');
  }
}, 500);
orphanWatch.unref();
child.on('exit', (code, signal) => {
  clearInterval(orphanWatch);
  process.exitCode = code ?? (signal ? 1 : 0);
});
