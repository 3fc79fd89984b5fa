/**
 * Connections to the queue's Redis: one check that it answers (a one-line error otherwise), and clients
 * for BullMQ (which wants `maxRetriesPerRequest: null` on the clients its workers block on).
 */
import { isIP } from "node:net";
import { Redis } from "ioredis";
import { QueueError } from "../../errors.js";
import type { QueueAddress } from "./address.js";

/** How long to wait for Redis to answer before saying it cannot be reached. */
const CONNECT_TIMEOUT_MS = 5000;

function options(a: QueueAddress, failFast: boolean) {
  return {
    host: a.host,
    port: a.port,
    db: a.db,
    ...(a.username ? { username: a.username } : {}),
    ...(a.password ? { password: a.password } : {}),
    // TLS names the server for its certificate; an IP address is not a server name (RFC 6066).
    ...(a.tls ? { tls: isIP(a.host) ? {} : { servername: a.host } } : {}),
    connectTimeout: CONNECT_TIMEOUT_MS,
    lazyConnect: true,
    // A producer's first contact fails at once; afterwards, and for workers, ioredis reconnects.
    ...(failFast ? { retryStrategy: () => null, maxRetriesPerRequest: 0, enableOfflineQueue: false } : { maxRetriesPerRequest: null }),
  };
}

/** Says why Redis could not be reached, in a line without stack or password. */
function reason(e: unknown): string {
  const err = e as { code?: string; message?: string };
  if (err.code === "ECONNREFUSED") return "connection refused (is redis-server running there?)";
  if (err.code === "ENOTFOUND" || err.code === "EAI_AGAIN") return "host not found";
  if (/WRONGPASS|NOAUTH|invalid password|AUTH/i.test(err.message ?? "")) return "authentication failed (give the password in the URL or in OVERASK_REDIS_PASSWORD)";
  if (/CERT|SELF_SIGNED|UNABLE_TO_VERIFY|ERR_TLS_CERT/i.test(err.code ?? "")) return `${err.message} (a private CA is trusted with NODE_EXTRA_CA_CERTS=<its PEM file>)`;
  if (/ECONNRESET|EPROTO|SSL|TLS/i.test(`${err.code ?? ""} ${err.message ?? ""}`)) return `the connection was reset (${err.code ?? err.message}; a TLS server wants rediss://, a plain one redis://)`;
  if (/timeout|ETIMEDOUT/i.test(err.message ?? "")) return `no answer within ${CONNECT_TIMEOUT_MS / 1000} s (a plain server given rediss://, or a firewall)`;
  return (err.message ?? String(e)).split("\n")[0];
}

/**
 * A connected client. With `check`, the connection is tried once and its failure is a QueueError
 * (exit 3) rather than endless reconnecting; the client returned then reconnects like any other.
 */
export async function connectRedis(a: QueueAddress): Promise<Redis> {
  const probe = new Redis(options(a, true));
  // ioredis reports the cause (refused, not found, wrong password) as an event, then rejects with "Connection is closed".
  let cause: unknown;
  probe.on("error", (e) => (cause ??= e));
  try {
    await probe.connect();
    await probe.ping();
  } catch (e) {
    probe.disconnect();
    throw new QueueError(`cannot reach the queue's Redis: ${reason(cause ?? e)}`, { file: a.shown });
  }
  probe.disconnect();
  const client = new Redis(options(a, false));
  client.on("error", () => {});
  await client.connect();
  return client;
}
