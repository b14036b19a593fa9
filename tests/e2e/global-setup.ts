import { execSync } from 'node:child_process';
import type { TestProject } from 'vitest/node';
import { ensureChromium } from '../../scripts/ensure-chromium';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The chromium executable the browser tests drive (tests/e2e/harness.ts). */
    chromiumPath: string;
  }
}

/**
 * Before any browser test: find Debian's chromium (or install it as root; otherwise stop at once with
 * the one line to run), then build the client (and the map's tiles when missing) once, as `npm start` does.
 */
export default function setup(project: TestProject) {
  project.provide('chromiumPath', ensureChromium());
  // vitest sets NODE_ENV=test; the browser tests should run the production React build.
  execSync('npx vite build --logLevel warn', { stdio: 'inherit', env: { ...process.env, NODE_ENV: 'production' } });
  execSync('npx tsx scripts/tiles/build-tiles.ts --if-missing', { stdio: 'inherit' });
}
