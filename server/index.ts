/**
 * The server's entry. With HEADROOM_PROCESSES > 1 (the default is one per core, server/config.ts)
 * this process is the supervisor: it starts that many app processes with node:cluster, which share
 * the one port (the supervisor hands out connections in turn), restarts one that crashes, and on
 * SIGINT/SIGTERM asks each to stop and waits for them. Each app process is stateless: sessions,
 * the e-mail outbox (claimed with FOR UPDATE SKIP LOCKED, so two processes never send one message)
 * and the rate limits' counts (RATE_LIMIT_STORE) are in PostgreSQL.
 */
import cluster, { type Worker } from 'node:cluster';
import { loadConfig } from './config';
import { createDb } from './db/knex';
import { createApp } from './app';
import { installCrashHandlers, log } from './log';

const config = loadConfig();

if (cluster.isPrimary && config.HEADROOM_PROCESSES > 1) supervise(config.HEADROOM_PROCESSES);
else serve();

function serve() {
  const db = createDb(config.DATABASE_URL);
  const { app, close, devMail } = createApp({ config, db, startOutbox: true, oneOfSeveralProcesses: cluster.isWorker });
  void devMail?.ready.then(
    ({ port }) => log.info(`development mail sink on 127.0.0.1:${port} (messages at /api/dev/mail)`),
    (err) => log.error({ err }, 'the development mail sink did not start'),
  );

  const server = app.listen(config.PORT, config.HOST, () => {
    const address = server.address();
    const port = typeof address === 'object' && address ? address.port : config.PORT;
    const which = cluster.isWorker ? ` (app process ${cluster.worker!.id}, pid ${process.pid})` : '';
    log.info(`listening on http://${config.HOST}:${port}${which}`);
  });

  let stopping = false;
  async function stop(signal: string) {
    if (stopping) return;
    stopping = true;
    if (!cluster.isWorker) log.info(`${signal}: stopping`);
    // no new connections; answers in flight finish, then the pool and the outbox worker close
    server.close();
    await close().catch(() => {});
    await db.destroy().catch(() => {});
    process.exit(0);
  }
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
  installCrashHandlers(async () => {
    server.close();
    await close().catch(() => {});
    await db.destroy().catch(() => {});
  });
}

function supervise(count: number) {
  log.info(`starting ${count} app processes on one port (HEADROOM_PROCESSES=${count})`);
  let stopping = false;
  /** crashes in the last minute: a process that keeps dying (a bad setting, the port taken) stops the whole server */
  const crashes: number[] = [];
  const CRASHES_PER_MINUTE = 5; // a choice: a rare crash is restarted, a loop is not

  /** the app processes alive now (cluster.workers lags behind an exit) */
  const alive = new Set<Worker>();
  const fork = () => alive.add(cluster.fork());
  for (let i = 0; i < count; i++) fork();

  cluster.on('exit', (worker: Worker, code: number | null, signal: string | null) => {
    alive.delete(worker);
    if (stopping) {
      if (alive.size === 0) process.exit(exitCode);
      return;
    }
    // an app process stopped on its own: a clean stop (code 0) is left alone, a crash is replaced
    if (code === 0) {
      if (alive.size === 0) process.exit(0);
      return;
    }
    const now = Date.now();
    crashes.push(now);
    while (crashes.length && crashes[0] < now - 60_000) crashes.shift();
    log.error(`app process ${worker.id} (pid ${worker.process.pid}) ended (${signal ?? `exit ${code}`})`);
    if (crashes.length > CRASHES_PER_MINUTE) {
      log.fatal(`app processes ended ${crashes.length} times in a minute: stopping the server (see the messages above)`);
      stopAll('crash loop', 1);
      return;
    }
    log.warn('starting a new app process in its place');
    fork();
  });

  let exitCode = 0;
  function stopAll(reason: string, code = 0) {
    if (stopping) return;
    stopping = true;
    exitCode = code;
    log.info(`${reason}: stopping ${alive.size} app processes`);
    if (alive.size === 0) process.exit(exitCode);
    for (const w of alive) w.process.kill('SIGTERM');
    // answers in flight get 20 s (a choice, longer than any request here); then the stragglers are ended
    setTimeout(() => {
      for (const w of alive) w.process.kill('SIGKILL');
      process.exit(exitCode);
    }, 20_000).unref();
  }
  process.on('SIGINT', () => stopAll('SIGINT'));
  process.on('SIGTERM', () => stopAll('SIGTERM'));
}
