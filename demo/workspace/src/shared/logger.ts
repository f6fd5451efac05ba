// Structured logging for the service. Lines are JSON so the harbour office can grep them and
// the nightly report can count refunds, cancellations and alarms without parsing prose.

export type Level = "debug" | "info" | "warn" | "error";

const LEVEL_ORDER: Record<Level, number> = { debug: 10, info: 20, warn: 30, error: 40 };

export interface LogSink {
  write(line: string): void;
}

export interface Logger {
  debug(message: string, fields?: Record<string, unknown>): void;
  info(message: string, fields?: Record<string, unknown>): void;
  warn(message: string, fields?: Record<string, unknown>): void;
  error(message: string, fields?: Record<string, unknown>): void;
  child(fields: Record<string, unknown>): Logger;
}

export function createLogger(
  sink: LogSink,
  minimum: Level = "info",
  base: Record<string, unknown> = {},
  now: () => Date = () => new Date(),
): Logger {
  const emit = (level: Level, message: string, fields?: Record<string, unknown>) => {
    if (LEVEL_ORDER[level] < LEVEL_ORDER[minimum]) return;
    const record = { time: now().toISOString(), level, message, ...base, ...fields };
    sink.write(JSON.stringify(record));
  };
  return {
    debug: (m, f) => emit("debug", m, f),
    info: (m, f) => emit("info", m, f),
    warn: (m, f) => emit("warn", m, f),
    error: (m, f) => emit("error", m, f),
    child: (fields) => createLogger(sink, minimum, { ...base, ...fields }, now),
  };
}

/** Collects lines in memory; used by tests to assert on what was logged. */
export class MemorySink implements LogSink {
  readonly lines: string[] = [];
  write(line: string): void {
    this.lines.push(line);
  }
  records(): Array<Record<string, unknown>> {
    return this.lines.map((line) => JSON.parse(line) as Record<string, unknown>);
  }
}

export const stdoutSink: LogSink = {
  write(line: string) {
    process.stdout.write(line + "\n");
  },
};
