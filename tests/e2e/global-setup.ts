import { execSync } from 'node:child_process';

/** Build the client (and the map's tiles when missing) once for every browser test, as `npm start` does. */
export default function setup() {
  execSync('npx vite build --logLevel warn', { stdio: 'inherit' });
  execSync('npx tsx scripts/tiles/build-tiles.ts --if-missing', { stdio: 'inherit' });
}
