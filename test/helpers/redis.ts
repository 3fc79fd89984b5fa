/**
 * A real Redis for queue tests: Debian's redis-server on 127.0.0.1 (no other address) on a free port, with
 * no persistence. Tests that need it are skipped, saying so, when redis-server is missing.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { createServer } from "node:net";

export const hasRedis = spawnSync("redis-server", ["--version"], { stdio: "ignore" }).error === undefined;
if (!hasRedis) console.log("queue tests skipped: redis-server is not installed (apt-get install redis-server)");

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
    s.on("error", reject);
  });
}

export interface RedisServer {
  port: number;
  url(queue: string): string;
  stop(): Promise<void>;
}

/** A redis-server on 127.0.0.1 and a free port; with `mode` "tls", the port is its TLS port (give the TLS options in `extra`). */
export async function startRedis(extra: string[] = [], mode: "plain" | "tls" = "plain"): Promise<RedisServer> {
  const port = await freePort();
  const portArgs = mode === "tls" ? ["--tls-port", String(port)] : ["--port", String(port)];
  const proc: ChildProcess = spawn("redis-server", ["--bind", "127.0.0.1", ...portArgs, "--save", "", "--appendonly", "no", ...extra], { stdio: ["ignore", "pipe", "pipe"] });
  await new Promise<void>((resolve, reject) => {
    let text = "";
    proc.stdout!.on("data", (d: Buffer) => {
      text += d.toString();
      if (/Ready to accept connections/.test(text)) resolve();
    });
    proc.on("exit", (code) => reject(new Error(`redis-server exited (${code}): ${text.slice(-500)}`)));
  });
  return {
    port,
    url: (queue) => `redis://127.0.0.1:${port}/${queue}`,
    stop: () =>
      new Promise((resolve) => {
        proc.once("exit", () => resolve());
        proc.kill("SIGTERM");
      }),
  };
}
