// The test command's browser check (scripts/ensure-chromium.ts). Chromium cannot be uninstalled on the
// shared development machine, so a bare machine is simulated: fake PATH folders, no default places, and
// a fake `apt-get` that "installs" a chromium the way Debian's package would (an executable on the PATH).
import { execSync, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { ChromiumMissingError, CHROMIUM_INSTALL_COMMAND, ensureChromium, findChromium, MISSING_CHROMIUM_LINE, type ChromiumEnvironment } from '../../scripts/ensure-chromium';

const dirs: string[] = [];
const tempDir = () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'syconium-chromium-'));
  dirs.push(dir);
  return dir;
};
afterEach(() => {
  for (const dir of dirs.splice(0)) fs.rmSync(dir, { recursive: true, force: true });
});

const writeExecutable = (file: string, body = 'exit 0') => {
  fs.writeFileSync(file, `#!/bin/sh\n${body}\n`);
  fs.chmodSync(file, 0o755);
  return file;
};

/** A machine with nothing but the given PATH folders. */
const bareMachine = (pathDirs: string[], overrides: Partial<ChromiumEnvironment> = {}): ChromiumEnvironment & { ran: string[] } => {
  const ran: string[] = [];
  return {
    candidates: [],
    pathVar: pathDirs.join(path.delimiter),
    isRoot: false,
    run: (command) => {
      ran.push(command);
      execSync(command, { env: { PATH: pathDirs.join(path.delimiter) + path.delimiter + '/bin:/usr/bin' }, stdio: 'ignore' });
    },
    ran,
    ...overrides,
  };
};

describe('finding chromium', () => {
  it('finds a chromium on the PATH, and skips a file that is not executable', () => {
    const bin = tempDir();
    fs.writeFileSync(path.join(bin, 'chromium'), 'not executable');
    expect(findChromium(bareMachine([bin]))).toBeNull();
    const exe = writeExecutable(path.join(bin, 'chromium'));
    expect(findChromium(bareMachine([tempDir(), bin]))).toBe(exe);
  });

  it("prefers Debian's fixed place, and CHROMIUM_PATH over both", () => {
    const bin = tempDir();
    writeExecutable(path.join(bin, 'chromium'));
    const fixed = writeExecutable(path.join(tempDir(), 'chromium'));
    const chosen = writeExecutable(path.join(tempDir(), 'my-chromium'));
    expect(findChromium(bareMachine([bin], { candidates: [fixed] }))).toBe(fixed);
    expect(findChromium(bareMachine([bin], { candidates: [fixed], override: chosen }))).toBe(chosen);
    expect(findChromium(bareMachine([bin], { candidates: [fixed], override: '/nowhere/chromium' }))).toBeNull();
  });
});

describe('ensuring chromium before the browser tests', () => {
  it('without chromium and not root: stops with the one line to run, installing nothing', () => {
    const bin = tempDir();
    writeExecutable(path.join(bin, 'apt-get'));
    const machine = bareMachine([bin]);
    expect(() => ensureChromium(machine)).toThrow(ChromiumMissingError);
    expect(() => ensureChromium(machine)).toThrow(MISSING_CHROMIUM_LINE);
    expect(MISSING_CHROMIUM_LINE).not.toContain('\n');
    expect(MISSING_CHROMIUM_LINE).toContain('apt-get install -y chromium');
    expect(machine.ran).toEqual([]);
  });

  it('as root without apt-get (not Debian): stops with the same line', () => {
    const machine = bareMachine([tempDir()], { isRoot: true });
    expect(() => ensureChromium(machine)).toThrow(MISSING_CHROMIUM_LINE);
    expect(machine.ran).toEqual([]);
  });

  it("as root with apt-get: runs apt-get update and install, then uses the package's chromium", () => {
    const bin = tempDir();
    const log = path.join(bin, 'apt.log');
    // The fake apt-get logs its arguments; "install -y chromium" puts an executable chromium on the PATH.
    writeExecutable(path.join(bin, 'apt-get'), `echo "$@" >> ${log}\nif [ "$1" = install ]; then printf '#!/bin/sh\\n' > ${bin}/chromium; chmod +x ${bin}/chromium; fi`);
    const machine = bareMachine([bin], { isRoot: true });
    expect(ensureChromium(machine)).toBe(path.join(bin, 'chromium'));
    expect(machine.ran).toEqual([CHROMIUM_INSTALL_COMMAND]);
    expect(fs.readFileSync(log, 'utf8').trim().split('\n')).toEqual(['update', 'install -y chromium']);
    // Found the second time: nothing installed again.
    expect(ensureChromium(machine)).toBe(path.join(bin, 'chromium'));
    expect(machine.ran).toHaveLength(1);
  });

  it('as root when apt-get fails: stops with the line rather than a package manager trace', () => {
    const bin = tempDir();
    writeExecutable(path.join(bin, 'apt-get'), 'exit 100');
    expect(() => ensureChromium(bareMachine([bin], { isRoot: true }))).toThrow(MISSING_CHROMIUM_LINE);
  });

  it('the pretest script prints exactly that line and exits 1 on a machine without chromium', () => {
    const result = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/ensure-chromium.ts'], {
      env: { PATH: tempDir(), CHROMIUM_PATH: '/nowhere/chromium', HOME: os.tmpdir() },
      encoding: 'utf8',
    });
    expect(result.status).toBe(1);
    expect(result.stderr.trim()).toBe(MISSING_CHROMIUM_LINE);
    expect(result.stdout).toBe('');
  });
});
