import fs from 'node:fs';
import path from 'node:path';
import { loadConfig } from '../config/env';
import { devDatabaseServer, openDevDatabase } from './database';
import { prepareLocalEnv } from './local-env';

/** `npm run db:start|db:stop|db:status|db:reset|migration:run` for the private development database. */
async function main(command: string | undefined): Promise<void> {
  prepareLocalEnv();
  const config = loadConfig();
  const server = devDatabaseServer(config);
  switch (command) {
    case 'start': {
      const ds = await openDevDatabase(config, console.log);
      await ds.destroy();
      return;
    }
    case 'migrate': {
      const ds = await openDevDatabase(config, console.log);
      await ds.destroy();
      return;
    }
    case 'stop':
      console.log((await server.stop()) === 'stopped' ? 'MariaDB stopped.' : 'MariaDB was not running.');
      return;
    case 'status':
      console.log((await server.isRunning()) ? `MariaDB is running on 127.0.0.1:${config.db.port} (data in ${server.dataDir}).` : 'MariaDB is not running.');
      return;
    case 'reset': {
      await server.destroy();
      fs.rmSync(path.join(config.varDir, 'mail'), { recursive: true, force: true });
      console.log('MariaDB stopped and its data deleted. The next `npm start` builds a fresh database with the demo scenario.');
      return;
    }
    default:
      console.error('Usage: tsx server/setup/db-cli.ts start|stop|status|reset|migrate');
      process.exitCode = 2;
  }
}

main(process.argv[2]).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err);
  process.exitCode = 1;
});
