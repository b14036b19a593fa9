import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { startServerProcess, type ServerProcess } from '../../scripts/server-process';

/** The production server (scripts/server-process.ts) with its database and uploads in a new temporary folder. */
export interface TempServer {
  /** The server's settings: SYCONIUM_DB and SYCONIUM_UPLOADS in the folder, then the caller's. */
  env: Record<string, string>;
  /** The running server process (a new one after `restart`). */
  process: ServerProcess;
  /** Start the server again on the same files, after a kill or a stop. */
  restart: () => Promise<ServerProcess>;
  /** Stop the server and delete the folder. */
  remove: () => Promise<void>;
}

/** Start the production server on its own files; `name` names the folder and the database file. */
export async function startTempServer(name: string, env: Record<string, string> = {}): Promise<TempServer> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `syconium-${name}-`));
  // The production server refuses to start without its own session secret; one per temporary server, kept across restarts.
  const settings = { SYCONIUM_DB: path.join(dir, `${name}.db`), SYCONIUM_UPLOADS: path.join(dir, 'uploads'), SESSION_SECRET: randomBytes(32).toString('hex'), ...env };
  const removeDir = () => fs.rmSync(dir, { recursive: true, force: true });
  let process: ServerProcess;
  try {
    process = await startServerProcess(settings);
  } catch (error) {
    removeDir();
    throw error;
  }
  const temp: TempServer = {
    env: settings,
    process,
    restart: async () => (temp.process = await startServerProcess(settings)),
    remove: async () => {
      await temp.process.stop();
      removeDir();
    },
  };
  return temp;
}
