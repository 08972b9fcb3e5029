import { execFileSync, spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, chmodSync, writeFileSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';

/**
 * A private PostgreSQL cluster from Debian's packages, on loopback and a port of its own.
 * As root, initdb and postgres run as the `postgres` user (they refuse root).
 */
export interface LocalPostgres {
  url: string;
  dataDir: string;
  stop(): Promise<void>;
  /** `pg_ctl -m fast restart`: every connection is cut and the server is back when this resolves. */
  restart(): Promise<void>;
  /** Stops the server (fast: connections are cut) and keeps the cluster for `resume`: a database outage. */
  halt(): Promise<void>;
  /** Starts the halted server again with the same settings; resolves once it accepts connections. */
  resume(): Promise<void>;
}

type Log = (msg: string) => void;
const isRoot = () => process.getuid?.() === 0;

function binDir(log: Log): string {
  const find = () => {
    const base = '/usr/lib/postgresql';
    if (!existsSync(base)) return null;
    const versions = readdirSync(base)
      .filter((v) => existsSync(path.join(base, v, 'bin', 'postgres')))
      .sort((a, b) => Number(b) - Number(a));
    return versions.length ? path.join(base, versions[0], 'bin') : null;
  };
  let dir = find();
  if (!dir) {
    if (!isRoot()) {
      throw new Error('PostgreSQL is not installed. Install it with: sudo apt-get install -y postgresql');
    }
    log('PostgreSQL is missing: installing Debian\'s postgresql package with apt (about a minute)…');
    execFileSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
    execFileSync('apt-get', ['install', '-y', '-qq', 'postgresql'], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
    dir = find();
    if (!dir) throw new Error('PostgreSQL was installed but its binaries were not found under /usr/lib/postgresql.');
  }
  return dir;
}

function asPostgres(cmd: string, args: string[]): [string, string[]] {
  return isRoot() ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
}

function run(cmd: string, args: string[]) {
  const [c, a] = asPostgres(cmd, args);
  const r = spawnSync(c, a, { encoding: 'utf8', cwd: '/' });
  return { ok: r.status === 0, out: `${r.stdout ?? ''}${r.stderr ?? ''}` };
}

/** As `run`, without blocking the event loop (the caller's connections see the server go and come back). */
function runAsync(cmd: string, args: string[]): Promise<{ ok: boolean; out: string }> {
  const [c, a] = asPostgres(cmd, args);
  return new Promise((resolve) => {
    const child = spawn(c, a, { cwd: '/', stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d: Buffer) => (out += d));
    child.stderr.on('data', (d: Buffer) => (out += d));
    child.on('error', (err) => resolve({ ok: false, out: `${out}${err.message}` }));
    child.on('close', (code) => resolve({ ok: code === 0, out }));
  });
}

/** As root the postgres user must be able to enter every parent; otherwise use a folder it can. */
function reachableBase(wanted: string, log: Log, fallbackKey: string): string {
  mkdirSync(wanted, { recursive: true });
  if (!isRoot()) return wanted;
  spawnSync('chown', ['postgres:postgres', wanted]);
  const test = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', wanted, '-a', '-w', wanted]);
  if (test.status === 0) return wanted;
  const pointer = path.join(wanted, 'FALLBACK');
  if (existsSync(pointer)) {
    const previous = readFileSync(pointer, 'utf8').trim();
    if (existsSync(previous)) {
      log(`The postgres user cannot reach ${wanted}; using ${previous} (as before).`);
      return previous;
    }
  }
  const base = mkdtempSync(path.join(os.tmpdir(), `toneledger-${fallbackKey}-`));
  chmodSync(base, 0o755);
  spawnSync('chown', ['postgres:postgres', base]);
  writeFileSync(pointer, base);
  log(`The postgres user cannot reach ${wanted}; the cluster lives in ${base} instead.`);
  return base;
}

export async function startPostgres(options: { baseDir: string; port: number; database: string; log: Log; fallbackKey: string }): Promise<LocalPostgres> {
  const { log } = options;
  const bin = binDir(log);
  const base = reachableBase(options.baseDir, log, options.fallbackKey);
  const dataDir = path.join(base, 'data');
  const sockDir = path.join(base, 'sock');
  const logFile = path.join(base, 'server.log');
  if (!existsSync(path.join(dataDir, 'PG_VERSION'))) {
    mkdirSync(dataDir, { recursive: true });
    if (isRoot()) spawnSync('chown', ['-R', 'postgres:postgres', base]);
    const init = run(path.join(bin, 'initdb'), ['-D', dataDir, '-U', 'app', '--auth=trust', '-E', 'UTF8', '--locale=C.UTF-8']);
    if (!init.ok) throw new Error(`initdb failed:\n${init.out}`);
    log(`Created a PostgreSQL cluster in ${dataDir}`);
  }
  mkdirSync(sockDir, { recursive: true });
  if (isRoot()) spawnSync('chown', ['postgres:postgres', sockDir, base]);
  const pgCtl = path.join(bin, 'pg_ctl');
  if (run(pgCtl, ['-D', dataDir, 'status']).ok) {
    log('A PostgreSQL server left running on this cluster is stopped first.');
    run(pgCtl, ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
  }
  // Memory settings for a collection-sized catalogue: the prints table and its indexes stay in shared buffers.
  const opts = `-c listen_addresses=127.0.0.1 -c port=${options.port} -c unix_socket_directories=${sockDir} -c shared_buffers=384MB -c work_mem=16MB -c effective_cache_size=2GB -c random_page_cost=1.1`;
  const startArgs = ['-D', dataDir, '-l', logFile, '-w', '-t', '30', '-o', opts, 'start'];
  const failed = (what: string, out: string) => {
    const tail = existsSync(logFile) ? readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
    return new Error(`PostgreSQL did not ${what} on port ${options.port}:\n${out}\n${tail}`);
  };
  const started = run(pgCtl, startArgs);
  if (!started.ok) throw failed('start', started.out);
  const admin = new pg.Client({ host: '127.0.0.1', port: options.port, user: 'app', database: 'postgres' });
  await admin.connect();
  const exists = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [options.database]);
  if (exists.rowCount === 0) await admin.query(`CREATE DATABASE "${options.database.replace(/"/g, '')}"`);
  await admin.end();
  let stopped = false;
  return {
    url: `postgres://app@127.0.0.1:${options.port}/${options.database}`,
    dataDir,
    stop: async () => {
      if (stopped) return;
      stopped = true;
      run(pgCtl, ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
    },
    restart: async () => {
      const r = await runAsync(pgCtl, ['-D', dataDir, '-l', logFile, '-m', 'fast', '-w', '-t', '30', '-o', opts, 'restart']);
      if (!r.ok) throw failed('restart', r.out);
    },
    halt: async () => {
      const r = await runAsync(pgCtl, ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
      if (!r.ok) throw failed('stop', r.out);
    },
    resume: async () => {
      const r = await runAsync(pgCtl, startArgs);
      if (!r.ok) throw failed('start', r.out);
    },
  };
}

/** Synchronous stop for exit handlers. */
export function stopPostgresSync(dataDir: string): void {
  try {
    const bin = binDir(() => {});
    run(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', 'stop']);
  } catch {
    /* nothing left to stop */
  }
}
