// A logger as server/index.ts makes it (same redaction, JSON lines) that writes to memory, so a
// test can read exactly what an operator would see.
import { createLogger, type Logger } from '@/server/logger';

export interface CapturedLogs {
  logger: Logger;
  /** Everything written so far, as the raw text of the log. */
  text(): string;
  /** Each line parsed. */
  lines(): Record<string, unknown>[];
}

export function captureLogs(level: 'info' | 'debug' = 'info'): CapturedLogs {
  const chunks: string[] = [];
  const logger = createLogger({
    level,
    destination: { write: (line: string) => void chunks.push(line) },
  });
  const text = () => chunks.join('');
  return {
    logger,
    text,
    lines: () =>
      text()
        .split('\n')
        .filter(Boolean)
        .map((line) => JSON.parse(line) as Record<string, unknown>),
  };
}
