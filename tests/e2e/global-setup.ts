import { execSync } from 'node:child_process';

/** Build the client (and the map's tiles when missing) once for every browser test, as `npm start` does. */
export default function setup() {
  // vitest sets NODE_ENV=test; the browser tests should run the production React build.
  execSync('npx vite build --logLevel warn', { stdio: 'inherit', env: { ...process.env, NODE_ENV: 'production' } });
  execSync('npx tsx scripts/tiles/build-tiles.ts --if-missing', { stdio: 'inherit' });
}
