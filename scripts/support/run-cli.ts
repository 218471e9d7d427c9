/**
 * Runs a command-line script's `main` and sets the exit status it answers; an unexpected error
 * prints its stack on stderr and exits with 1 (stdout stays the JSON contract's alone).
 */
export function runCli(main: () => Promise<number>): void {
  main().then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      process.stderr.write(`${error instanceof Error ? error.stack : String(error)}\n`);
      process.exitCode = 1;
    },
  );
}
