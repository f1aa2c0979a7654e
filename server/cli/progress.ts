/** One line per set-up step, so a first `npm start` says what it is doing while it waits. */
export function progress(message: string): void {
  process.stdout.write(`flakeline: ${message}\n`);
}
