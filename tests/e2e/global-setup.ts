import { execSync } from 'node:child_process';

/** Build the client once for every browser test, so they run against what `npm start` serves. */
export default function setup() {
  execSync('npx vite build --logLevel warn', { stdio: 'inherit' });
}
