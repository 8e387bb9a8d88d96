// A small levelled logger. error goes to console.error (tests that expect one spy on it).
export type LogLevel = 'debug' | 'info' | 'warn' | 'error' | 'silent';
export type Logger = {
  debug(message: string, extra?: unknown): void;
  info(message: string, extra?: unknown): void;
  warn(message: string, extra?: unknown): void;
  error(message: string, extra?: unknown): void;
};

const order: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40, silent: 100 };

export function createLogger(level: LogLevel): Logger {
  const on = (l: LogLevel) => order[l] >= order[level];
  const fmt = (l: string, m: string) => `${new Date().toISOString()} ${l} ${m}`;
  const args = (extra: unknown) => (extra === undefined ? [] : [extra]);
  return {
    debug: (m, e) => on('debug') && console.log(fmt('debug', m), ...args(e)),
    info: (m, e) => on('info') && console.log(fmt('info', m), ...args(e)),
    warn: (m, e) => on('warn') && console.warn(fmt('warn', m), ...args(e)),
    error: (m, e) => on('error') && console.error(fmt('error', m), ...args(e)),
  };
}
