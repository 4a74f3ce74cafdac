export type LogLevel = 'silent' | 'error' | 'warn' | 'info' | 'debug';

export interface Logger {
  error(msg: string, err?: unknown): void;
  warn(msg: string): void;
  info(msg: string): void;
  debug(msg: string): void;
}

const order: Record<LogLevel, number> = { silent: 0, error: 1, warn: 2, info: 3, debug: 4 };

/** A plain line logger to stderr/stdout with an ISO timestamp. */
export function createLogger(level: LogLevel = 'info'): Logger {
  const on = (l: LogLevel) => order[l] <= order[level];
  const stamp = () => new Date().toISOString();
  return {
    error: (msg, err) => {
      if (!on('error')) return;
      console.error(`${stamp()} ERROR ${msg}`);
      if (err) console.error(err instanceof Error ? err.stack : err);
    },
    warn: (msg) => on('warn') && console.warn(`${stamp()} WARN  ${msg}`),
    info: (msg) => on('info') && console.log(`${stamp()} INFO  ${msg}`),
    debug: (msg) => on('debug') && console.log(`${stamp()} DEBUG ${msg}`),
  };
}
