// Development: the API server (restarted on change by tsx watch) and Vite's dev server with its
// proxy to /api, side by side. Ctrl-C stops both.
import { spawn } from 'node:child_process';

const children = [
  spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'server/index.ts'], { stdio: 'inherit', env: { ...process.env, NODE_ENV: 'development' } }),
  spawn('npx', ['vite'], { stdio: 'inherit' }),
];
const stop = () => children.forEach((child) => child.kill('SIGTERM'));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
for (const child of children) child.on('exit', (code) => { if (code) { stop(); process.exitCode = code; } });
