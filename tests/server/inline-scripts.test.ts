import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { appShellScriptHashes, cspHashSource, inlineScripts } from '../../server/client/inline-scripts';
import { createTestContext } from '../helpers/test-app';

describe('the app shell’s inline scripts in the Content-Security-Policy', () => {
  it('hashes a script as browsers do', () => {
    // MDN, "content_security_policy" (WebExtensions manifest key), example allowing the inline
    // script <script>alert('Hello, world.');</script> by 'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='.
    expect(cspHashSource("alert('Hello, world.');")).toBe("'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='");
  });

  it('takes the text between the tags exactly, and only scripts without a src', () => {
    const html = `<head><script type="module" crossorigin src="/assets/index.js"></script>\n<script> a(1) </script><SCRIPT>b()</SCRIPT ></head>`;
    expect(inlineScripts(html)).toEqual([' a(1) ', 'b()']);
  });

  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-inline-scripts-'));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it('reads the built index.html; none without a build', () => {
    expect(appShellScriptHashes(dir)).toEqual([]);
    fs.writeFileSync(path.join(dir, 'index.html'), "<!doctype html><head><script>alert('Hello, world.');</script></head>");
    expect(appShellScriptHashes(dir)).toEqual(["'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='"]);
  });

  it('the server’s policy allows the built shell’s script by its hash, never any inline script', async () => {
    fs.writeFileSync(path.join(dir, 'index.html'), "<!doctype html><head><script>alert('Hello, world.');</script></head>");
    const { agent } = createTestContext({}, { clientDir: dir });
    const policy = (await agent().get('/api/health/live')).headers['content-security-policy'] as string;
    const scriptSrc = policy.split(';').find((directive) => directive.startsWith('script-src '));
    expect(scriptSrc).toBe("script-src 'self' 'sha256-qznLcsROx4GACP2dm0UCKCzCG+HiZ1guq6ZZDob/Tng='");
  });
});
