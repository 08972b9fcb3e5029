import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

/**
 * The API as its own process: `backend/src/server.ts`, the production entry (migrations, pg-boss
 * workers, the app), on the test database and the run's local services, on a free port.
 */
const ROOT = path.resolve(import.meta.dirname, '../..');
const SERVER = path.join(ROOT, 'backend/src/server.ts');

export interface ChildServer {
  url: string;
  child: ChildProcess;
}

/** Starts one server; resolves with its URL once it listens (its output is kept for the error). */
export function startChildServer(children: Set<ChildProcess>): Promise<ChildServer> {
  const child = spawn(process.execPath, ['--import', 'tsx', SERVER], {
    cwd: ROOT, env: { ...process.env, PORT: '0', LOG_LEVEL: 'error' }, stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  child.once('exit', () => children.delete(child));
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    const timer = setTimeout(() => { child.kill('SIGKILL'); reject(new Error(`the server did not start within 60 s: ${err.slice(-2000)}`)); }, 60_000);
    child.stderr!.on('data', (d: Buffer) => { err += d.toString(); });
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      const url = out.match(/listening on (http:\/\/\S+)/)?.[1];
      if (url) { clearTimeout(timer); resolve({ url, child }); }
    });
    child.once('exit', (code) => { clearTimeout(timer); reject(new Error(`the server exited (${code}) before listening: ${err.slice(-2000)}`)); });
  });
}

export function exited(child: ChildProcess): Promise<void> {
  return child.exitCode !== null || child.signalCode !== null ? Promise.resolve() : new Promise((r) => child.once('exit', () => r()));
}

/** Stops every child: SIGTERM (a graceful stop), then SIGKILL for any still running after `graceMs`. */
export async function stopChildServers(children: Set<ChildProcess>, graceMs = 15_000): Promise<void> {
  await Promise.all([...children].map(async (c) => {
    c.kill('SIGTERM');
    const deadline = setTimeout(() => c.kill('SIGKILL'), graceMs);
    await exited(c);
    clearTimeout(deadline);
  }));
}
