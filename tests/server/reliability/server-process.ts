import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import net from 'node:net';

async function freePort(): Promise<number> {
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
  stop: () => Promise<void>;
}

/**
 * The production server (NODE_ENV=production, server/index.ts) as its own node process, started
 * like tests/e2e/harness.ts but without npx or tsx's wrapper process, so a SIGKILL reaches the
 * process that holds the database.
 */
export async function startServerProcess(env: Record<string, string>): Promise<ServerProcess> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: { ...process.env, NODE_ENV: 'production', HOST: '127.0.0.1', PORT: String(port), SYCONIUM_DEV_MAIL: 'false', SESSION_SECRET: 'fault-test-secret', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout?.on('data', (chunk) => (output += chunk));
  child.stderr?.on('data', (chunk) => (output += chunk));
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const url = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 120_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited early:\n${output}`);
    try {
      if ((await fetch(`${url}/api/health`)).ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`server did not start:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  const end = async (signal: NodeJS.Signals) => {
    if (child.exitCode === null && child.signalCode === null) child.kill(signal);
    await exited;
  };
  return { url, child, output: () => output, kill: () => end('SIGKILL'), stop: () => end('SIGTERM') };
}

/** A multipart/form-data body with text fields and one file. */
export function multipartBody(fields: Record<string, string>, file: { field: string; name: string; type: string; content: Buffer | string }): { body: Buffer; contentType: string } {
  const boundary = `----syconium${Math.random().toString(16).slice(2)}`;
  const parts: Buffer[] = [];
  for (const [name, value] of Object.entries(fields)) {
    parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`));
  }
  parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${file.field}"; filename="${file.name}"\r\nContent-Type: ${file.type}\r\n\r\n`));
  parts.push(Buffer.isBuffer(file.content) ? file.content : Buffer.from(file.content));
  parts.push(Buffer.from(`\r\n--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), contentType: `multipart/form-data; boundary=${boundary}` };
}

/**
 * Send a request with node's http client. `sent` resolves when the whole body has been handed to
 * the operating system; `response` when the answer arrived (or the connection died: status 0).
 */
export function sendRequest(url: string, options: { method: string; headers: Record<string, string>; body: Buffer }): { sent: Promise<void>; response: Promise<{ status: number; text: string }> } {
  let markSent!: () => void;
  const sent = new Promise<void>((resolve) => (markSent = resolve));
  const response = new Promise<{ status: number; text: string }>((resolve) => {
    const req = http.request(url, { method: options.method, headers: { ...options.headers, 'content-length': String(options.body.length) } }, (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (chunk) => (text += chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text }));
      res.on('error', () => resolve({ status: 0, text }));
    });
    req.on('error', () => {
      markSent();
      resolve({ status: 0, text: '' });
    });
    req.on('finish', markSent);
    req.end(options.body);
  });
  return { sent, response };
}
