/**
 * The server's one logger: JSON lines on standard output (pino), one object per event with its
 * level, time, process id and message, so a log collector can filter by level and a person can
 * still grep the message. Written synchronously: the last words of a process that is about to exit
 * (a crash, a stop) are never lost in a buffer. LOG_LEVEL (default "info") sets the threshold.
 */
import { pino } from 'pino';

export const log = pino(
  {
    level: process.env.LOG_LEVEL ?? 'info',
    base: { pid: process.pid, app: 'headroom' },
    // errors passed as { err } keep their message and stack as fields
    serializers: { err: pino.stdSerializers.err },
  },
  pino.destination({ dest: 1, sync: true }),
);

/**
 * Last-resort handlers: a promise rejected with nobody to catch it, or an exception thrown outside
 * any request, means the process is in a state nobody planned for. It is logged as fatal with its
 * stack and the process stops with exit code 1 after `stop` (close the server, the pool) has had
 * its chance; the supervisor (or the service manager) starts a fresh one.
 */
export function installCrashHandlers(stop: () => Promise<void>): void {
  let crashing = false;
  const crash = (kind: string) => (err: unknown) => {
    log.fatal({ err }, `${kind}: the process stops`);
    if (crashing) return;
    crashing = true;
    // a stop that hangs must not keep a broken process alive: 5 s is ample for closing a pool (a choice)
    setTimeout(() => process.exit(1), 5000).unref();
    void stop().finally(() => process.exit(1));
  };
  process.on('unhandledRejection', crash('unhandled promise rejection'));
  process.on('uncaughtException', crash('uncaught exception'));
}
