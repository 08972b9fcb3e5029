import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { ROOT } from './services';

function newest(dir: string): number {
  let t = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name === 'node_modules' || entry.name === 'dist') continue;
    const p = path.join(dir, entry.name);
    t = Math.max(t, entry.isDirectory() ? newest(p) : statSync(p).mtimeMs);
  }
  return t;
}

/** Builds the client when its output is missing or older than any source it is built from. */
export function buildFrontend(log: (m: string) => void, force = false): void {
  const index = path.join(ROOT, 'frontend', 'dist', 'index.html');
  const sources = Math.max(newest(path.join(ROOT, 'frontend')), newest(path.join(ROOT, 'common', 'src')), newest(path.join(ROOT, 'fonts')));
  if (!force && existsSync(index) && statSync(index).mtimeMs >= sources) return;
  log('Building the web client…');
  // Always a production bundle, whatever mode the caller runs in.
  const r = spawnSync('npm', ['run', 'build', '-w', 'frontend', '--silent'], { cwd: ROOT, stdio: 'inherit', env: { ...process.env, NODE_ENV: 'production' } });
  if (r.status !== 0) throw new Error('The web client did not build.');
}
