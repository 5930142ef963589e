import { loadConfig } from './config';
import { createDb } from './db/knex';
import { createApp } from './app';

const config = loadConfig();
const db = createDb(config.DATABASE_URL);
const { app, close } = createApp({ config, db });

const server = app.listen(config.PORT, config.HOST, () => {
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  console.log(`[headroom] listening on http://${config.HOST}:${port}`);
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`[headroom] ${signal}: stopping`);
  server.close();
  await close().catch(() => {});
  await db.destroy().catch(() => {});
  process.exit(0);
}
process.on('SIGINT', () => void stop('SIGINT'));
process.on('SIGTERM', () => void stop('SIGTERM'));
