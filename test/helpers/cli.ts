import { run } from "../../src/cli/main.js";

/** Runs the CLI in-process with captured output and no terminal. */
export async function cli(args: string[], env: NodeJS.ProcessEnv = {}) {
  let stdout = "";
  let stderr = "";
  const code = await run(args, {
    stdout: { write: (s: string) => (stdout += s), isTTY: false },
    stderr: { write: (s: string) => (stderr += s), isTTY: false },
    env,
  });
  return { code, stdout, stderr };
}
