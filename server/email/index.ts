import type { Db } from '../db/client';
import type { Config } from '../lib/config';
import { startDevMailServer, type DevMailServer } from './dev-mail-server';
import { createMailer, type Mailer } from './mailer';

/**
 * Start e-mail for the running server: with the development mail server on (the default outside
 * production), a local SMTP server on 127.0.0.1 receives every message; otherwise mail goes to the
 * SMTP relay in the environment, or nowhere when none is set.
 */
export async function startMail(config: Config, db: Db): Promise<{ mailer: Mailer; devServer?: DevMailServer; close: () => Promise<void> }> {
  const devServer = config.devMail ? await startDevMailServer(db, config.devMailPort) : undefined;
  if (devServer) console.log(`Development mail server on 127.0.0.1:${devServer.port}; read the messages at ${config.appUrl}/dev/mail`);
  const mailer = createMailer(config, devServer?.port);
  return {
    mailer,
    devServer,
    close: async () => {
      mailer.close();
      await devServer?.close();
    },
  };
}
