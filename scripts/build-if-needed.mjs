// Builds the client when dist/ is missing or older than the sources, so `npm start` always serves a current build.
import { execSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

const built = 'dist/index.html';

function newest(dir) {
  let latest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    latest = Math.max(latest, entry.isDirectory() ? newest(full) : statSync(full).mtimeMs);
  }
  return latest;
}

const sources = Math.max(newest('src'), newest('public'), statSync('index.html').mtimeMs, statSync('vite.config.ts').mtimeMs);
if (!existsSync(built) || statSync(built).mtimeMs < sources) {
  console.log('Building the Holdfire client...');
  execSync('npx vite build', { stdio: 'inherit' });
}
