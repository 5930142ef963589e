import { loadConfig } from './config';
import { createDb } from './db/knex';
import { createApp } from './app';

const config = loadConfig();
const db = createDb(config.DATABASE_URL);
const { app, close, devMail } = createApp({ config, db, startOutbox: true });
void devMail?.ready.then(({ port }) => console.log(`[headroom] development mail sink on 127.0.0.1:${port} (messages at /api/dev/mail)`), (err) => console.error('[headroom] the development mail sink did not start:', err));

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
