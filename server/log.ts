/** Server log lines go to stderr with a timestamp; nothing else in the server prints. */
export function logLine(message: string): void {
  process.stderr.write(`${new Date().toISOString()} ${message}\n`);
}

export function logError(message: string, error: unknown): void {
  const detail = error instanceof Error ? (error.stack ?? error.message) : String(error);
  logLine(`${message}: ${detail}`);
}
