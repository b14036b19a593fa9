// The production server as a child process on a free port: used by the browser and fault tests
// (through tests/helpers/temp-server.ts) and by `npm run load`.
import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import net from 'node:net';

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
    server.on('error', reject);
  });
}

export interface ServerProcess {
  url: string;
  child: ChildProcess;
  output: () => string;
  /** SIGKILL: no shutdown code runs, as in a power cut or an OOM kill. */
  kill: () => Promise<void>;
  /** SIGTERM, then SIGKILL after `stopGraceMs` if it is still running. */
  stop: () => Promise<void>;
}

function signalGroup(child: ChildProcess, signal: NodeJS.Signals): void {
  try {
    process.kill(-child.pid!, signal);
  } catch {
    // already gone
  }
}

export interface ServerProcessOptions {
  /** Extra node flags before the script, e.g. `--cpu-prof`. */
  nodeArgs?: string[];
  /** How long to wait for /api/health (default 180 s). */
  startTimeoutMs?: number;
  /** How long stop() waits after SIGTERM before SIGKILL (default 5 s). */
  stopGraceMs?: number;
}

/**
 * The production server (NODE_ENV=production, server/index.ts) on a free port, as one node process
 * (tsx as a loader, not the tsx CLI, which forks a second one) in its own process group, so a signal
 * reaches the process that holds the database and stop() ends everything it started.
 * A cold start seeds the demo (two real station files): the wait allows for a busy machine.
 * Production refuses to start without SESSION_SECRET: unless the caller or the shell gives one, this process gets its own.
 */
export async function startServerProcess(env: Record<string, string>, { nodeArgs = [], startTimeoutMs = 180_000, stopGraceMs = 5_000 }: ServerProcessOptions = {}): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', 'server/index.ts'], {
    detached: true,
    env: { SESSION_SECRET: randomBytes(32).toString('hex'), ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk) => (output += chunk));
  child.stderr?.on('data', (chunk) => (output += chunk));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + startTimeoutMs;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      signalGroup(child, 'SIGKILL');
      throw new Error(`server did not start:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  const running = () => child.exitCode === null && child.signalCode === null;
  return {
    url,
    child,
    output: () => output,
    kill: async () => {
      if (running()) signalGroup(child, 'SIGKILL');
      await exited;
    },
    stop: async () => {
      if (!running()) return;
      signalGroup(child, 'SIGTERM');
      const timer = setTimeout(() => signalGroup(child, 'SIGKILL'), stopGraceMs);
      await exited;
      clearTimeout(timer);
    },
  };
}
