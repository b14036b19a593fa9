import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/** The scripts written inside an HTML page (no `src`), as their exact text. */
export function inlineScripts(html: string): string[] {
  return [...html.matchAll(/<script\b(?![^>]*\bsrc\s*=)[^>]*>([\s\S]*?)<\/script\s*>/gi)].map((match) => match[1]!).filter((text) => text.length > 0);
}

/** A script's Content-Security-Policy source: `'sha256-<base64 of the SHA-256 of its text>'` (CSP Level 2, "hash-source"). */
export function cspHashSource(script: string): string {
  return `'sha256-${createHash('sha256').update(script, 'utf8').digest('base64')}'`;
}

/**
 * The hash sources that let the built app shell's inline scripts run (the early pins request the
 * build writes into index.html: vite.config.ts, earlyPinsScript), read from `clientDir/index.html`
 * once at start; none when there is no build. Only these scripts run: never 'unsafe-inline'.
 */
export function appShellScriptHashes(clientDir: string): string[] {
  const indexHtml = path.join(clientDir, 'index.html');
  if (!fs.existsSync(indexHtml)) return [];
  return inlineScripts(fs.readFileSync(indexHtml, 'utf8')).map(cspHashSource);
}
