/**
 * A queue's address: `redis://[user[:password]@]host[:port]/<queue>` or `rediss://…` (TLS). The password
 * comes from the URL or, when the URL has none, from the OVERASK_REDIS_PASSWORD environment variable; it is
 * never part of what is printed (`shown`).
 */
import { UsageError } from "../../errors.js";

export interface QueueAddress {
  host: string;
  port: number;
  username?: string;
  password?: string;
  tls: boolean;
  /** The queue's name (the URL's path). */
  name: string;
  /** Redis database number (`?db=N`), 0 by default. */
  db: number;
  /** The address as outputs show it: no password, ever. */
  shown: string;
}

/** The environment variable a password is read from when the URL carries none. */
export const PASSWORD_VARIABLE = "OVERASK_REDIS_PASSWORD";

const NAME = /^[A-Za-z0-9._-]{1,100}$/;

/** Parses a queue address; a malformed one is a usage error that never repeats the password. */
export function parseQueueAddress(text: string, env: Record<string, string | undefined> = {}): QueueAddress {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new UsageError(`--queue wants redis://host:port/<queue name> (or rediss:// for TLS); got "${redact(text)}"`);
  }
  if (url.protocol !== "redis:" && url.protocol !== "rediss:") throw new UsageError(`--queue wants a redis:// or rediss:// address, not ${url.protocol}//`);
  const name = decodeURIComponent(url.pathname.replace(/^\//, ""));
  if (!NAME.test(name)) throw new UsageError(`--queue needs a queue name after the address (letters, digits, . _ -), as in redis://${url.host || "127.0.0.1:6379"}/inventory`);
  const port = url.port ? Number(url.port) : 6379;
  const db = url.searchParams.has("db") ? Number(url.searchParams.get("db")) : 0;
  if (!Number.isInteger(db) || db < 0) throw new UsageError(`--queue: db must be a whole number, got "${url.searchParams.get("db")}"`);
  const username = url.username ? decodeURIComponent(url.username) : undefined;
  const password = url.password ? decodeURIComponent(url.password) : env[PASSWORD_VARIABLE] || undefined;
  const host = url.hostname.replace(/^\[|\]$/g, "") || "127.0.0.1";
  return {
    host,
    port,
    ...(username ? { username } : {}),
    ...(password ? { password } : {}),
    tls: url.protocol === "rediss:",
    name,
    db,
    shown: `${url.protocol}//${username ? `${username}@` : ""}${url.host || host}/${name}${db ? `?db=${db}` : ""}`,
  };
}

/** Text with any `user:password@` part of a URL masked. */
export function redact(text: string): string {
  return text.replace(/(\/\/[^/:@\s]*):[^@/\s]*@/g, "$1:***@");
}
