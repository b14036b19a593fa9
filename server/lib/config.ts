import path from 'node:path';

/** Everything the server reads from its environment, in one place. */
export interface Config {
  env: 'development' | 'production' | 'test';
  port: number;
  host: string;
  dbFile: string;
  uploadsDir: string;
  tilesDir: string;
  clientDir: string;
  sessionSecret: string;
  seedDemo: boolean;
  adminEmail?: string;
  adminPassword?: string;
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const mode = env.NODE_ENV === 'production' ? 'production' : env.NODE_ENV === 'test' ? 'test' : 'development';
  return {
    env: mode,
    port: Number(env.PORT ?? 3030),
    host: env.HOST ?? '127.0.0.1',
    dbFile: env.SYCONIUM_DB ?? 'data/syconium.db',
    uploadsDir: env.SYCONIUM_UPLOADS ?? 'data/uploads',
    tilesDir: env.SYCONIUM_TILES ?? path.resolve('tiles'),
    clientDir: path.resolve('dist'),
    sessionSecret: env.SESSION_SECRET ?? 'syconium-development-secret-change-me',
    seedDemo: env.SYCONIUM_SEED_DEMO !== 'false',
    adminEmail: env.SYCONIUM_ADMIN_EMAIL,
    adminPassword: env.SYCONIUM_ADMIN_PASSWORD,
  };
}
