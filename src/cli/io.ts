/** Where the CLI writes and what it reads of its environment; tests pass their own. */
export interface Io {
  stdout: { write(s: string): unknown; isTTY?: boolean };
  stderr: { write(s: string): unknown; isTTY?: boolean };
  env: NodeJS.ProcessEnv;
}

export const processIo: Io = { stdout: process.stdout, stderr: process.stderr, env: process.env };
