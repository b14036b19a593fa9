// The browser tests drive Debian's chromium (never a downloaded browser). `npm test` runs this first
// (package.json "pretest") and the e2e project's global setup calls `ensureChromium()` again, so a
// bare machine either gets the browser installed (as root, with apt-get) or stops at once with one
// line saying what to run.
import { execSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

/** Where Debian's package puts the browser; CHROMIUM_PATH overrides. */
export const DEFAULT_CHROMIUM_PATHS = ['/usr/bin/chromium', '/usr/bin/chromium-browser'];
export const CHROMIUM_INSTALL_COMMAND = 'apt-get update && apt-get install -y chromium';
export const MISSING_CHROMIUM_LINE =
  "The browser tests need Debian's chromium: run `sudo apt-get update && sudo apt-get install -y chromium` (or set CHROMIUM_PATH to a Chromium executable), then npm test again.";

/** The flags every headless run uses (browser tests, the client bench): no sandbox in containers, no calls home. */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];

export interface ChromiumEnvironment {
  /** CHROMIUM_PATH, if set. */
  override?: string;
  /** Fixed places to look before the PATH. */
  candidates: string[];
  /** The PATH to search for `chromium` and `apt-get`. */
  pathVar: string;
  /** Whether this process may install packages (root). */
  isRoot: boolean;
  /** Runs a shell command, throwing on failure (execSync in real use). */
  run: (command: string) => void;
}

const isExecutable = (file: string) => {
  try {
    fs.accessSync(file, fs.constants.X_OK);
    return fs.statSync(file).isFile();
  } catch {
    return false;
  }
};

const onPath = (name: string, pathVar: string) =>
  pathVar
    .split(path.delimiter)
    .filter(Boolean)
    .map((dir) => path.join(dir, name))
    .find(isExecutable);

/** The chromium executable, or null: CHROMIUM_PATH, then Debian's places, then `chromium` on the PATH. */
export function findChromium(env: Pick<ChromiumEnvironment, 'override' | 'candidates' | 'pathVar'>): string | null {
  if (env.override) return isExecutable(env.override) ? env.override : null;
  return env.candidates.find(isExecutable) ?? onPath('chromium', env.pathVar) ?? onPath('chromium-browser', env.pathVar) ?? null;
}

export class ChromiumMissingError extends Error {
  constructor() {
    super(MISSING_CHROMIUM_LINE);
    this.name = 'ChromiumMissingError';
  }
}

/**
 * The chromium to drive: found, or installed with apt-get when this process is root and apt-get exists
 * (the README's "npm test" on a bare Debian machine), or a ChromiumMissingError whose message is the one
 * line to run. A CHROMIUM_PATH that does not exist is not "fixed" by installing: that is the caller's typo.
 */
export function ensureChromium(env: ChromiumEnvironment = realEnvironment()): string {
  const found = findChromium(env);
  if (found) return found;
  if (env.override || !env.isRoot || !onPath('apt-get', env.pathVar)) throw new ChromiumMissingError();
  console.log(`Browser tests: chromium is missing; installing Debian's package (${CHROMIUM_INSTALL_COMMAND})…`);
  try {
    env.run(CHROMIUM_INSTALL_COMMAND);
  } catch {
    throw new ChromiumMissingError();
  }
  const installed = findChromium(env);
  if (!installed) throw new ChromiumMissingError();
  return installed;
}

export function realEnvironment(): ChromiumEnvironment {
  return {
    override: process.env.CHROMIUM_PATH || undefined,
    candidates: DEFAULT_CHROMIUM_PATHS,
    pathVar: process.env.PATH ?? '',
    isRoot: process.getuid?.() === 0,
    run: (command) => execSync(command, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } }),
  };
}

// `tsx scripts/ensure-chromium.ts` (npm's pretest): one line and exit 1 when there is no browser.
if (import.meta.url === `file://${process.argv[1]}`) {
  try {
    ensureChromium();
  } catch (error) {
    if (!(error instanceof ChromiumMissingError)) throw error;
    console.error(error.message);
    process.exit(1);
  }
}
