/**
 * The workbench's gatekeeping, as pure decisions on a request's headers and paths (docs/contracts.md, the
 * workbench's HTTP contract): the Host allow-list (no DNS rebinding), the Origin of requests that
 * change something (no cross-site requests), the token when serving the network, and paths that
 * must stay inside the shop folder.
 */
import { randomBytes, timingSafeEqual } from "node:crypto";
import { realpathSync } from "node:fs";
import { networkInterfaces, hostname } from "node:os";
import { isAbsolute, relative, resolve, sep } from "node:path";

export interface Refusal {
  status: number;
  code: string;
  message: string;
}

/** Whether an address is the loopback (served to this machine only). */
export function isLoopback(host: string): boolean {
  const h = host.replace(/^\[|\]$/g, "").toLowerCase();
  return h === "localhost" || h === "::1" || /^127\.\d+\.\d+\.\d+$/.test(h);
}

/** A host name from a Host header or URL authority, without the port, lower case, IPv6 unbracketed. */
export function hostOnly(authority: string): string {
  const a = authority.trim().toLowerCase();
  if (a.startsWith("[")) return a.slice(1, a.indexOf("]") > 0 ? a.indexOf("]") : undefined);
  const colon = a.lastIndexOf(":");
  return colon >= 0 && a.indexOf(":") === colon ? a.slice(0, colon) : a;
}

/** The names a request's Host header may carry: the bound address, localhost, and when serving the network the machine's own names and addresses plus `--allow-host`. */
export function allowedHosts(bound: string, network: boolean, extra: string[] = []): Set<string> {
  const names = new Set(["localhost", "127.0.0.1", "::1", hostOnly(bound.includes(":") && !bound.startsWith("[") ? `[${bound}]` : bound)]);
  if (network) {
    const me = hostname().toLowerCase();
    names.add(me);
    names.add(`${me}.local`);
    for (const list of Object.values(networkInterfaces())) for (const a of list ?? []) names.add(a.address.toLowerCase());
  }
  for (const e of extra) names.add(hostOnly(e));
  return names;
}

const refuse = (status: number, code: string, message: string): Refusal => ({ status, code, message });

/** Refuse a Host header that is not an address this server serves (421: the request reached the wrong server). */
export function checkHost(host: string | undefined, allowed: Set<string>): Refusal | undefined {
  if (!host) return refuse(421, "host_refused", "the request has no Host header");
  if (!allowed.has(hostOnly(host)))
    return refuse(
      421,
      "host_refused",
      `this server does not answer for the host "${host}"; start it with --allow-host ${hostOnly(host)} if that name is yours`,
    );
  return undefined;
}

/** Refuse a request that changes something when it comes from another site (its Origin is present and foreign). */
export function checkOrigin(
  method: string,
  origin: string | undefined,
  fetchSite: string | undefined,
  host: string | undefined,
  allowed: Set<string>,
): Refusal | undefined {
  if (method === "GET" || method === "HEAD") return undefined;
  if (fetchSite === "cross-site") return refuse(403, "origin_refused", "a request from another site may not change anything here");
  if (origin === undefined) return undefined;
  let authority: string;
  try {
    const u = new URL(origin);
    if (u.protocol !== "http:") throw new Error("scheme");
    authority = u.host;
  } catch {
    return refuse(403, "origin_refused", `the request comes from "${origin}", not from this workbench`);
  }
  if (!host || authority.toLowerCase() !== host.toLowerCase() || !allowed.has(hostOnly(authority))) {
    return refuse(403, "origin_refused", `the request comes from "${origin}", not from this workbench`);
  }
  return undefined;
}

/** A fresh random token for one start of a server that serves the network. */
export function makeToken(): string {
  return randomBytes(24).toString("base64url");
}

/** Compare a presented token with the server's, in constant time. */
export function tokenMatches(given: string | undefined, token: string): boolean {
  if (!given) return false;
  const a = Buffer.from(given);
  const b = Buffer.from(token);
  return a.length === b.length && timingSafeEqual(a, b);
}

/** The token a request carries: `Authorization: Bearer …` or the workbench's cookie. */
export function presentedToken(authorization: string | undefined, cookie: string | undefined): string | undefined {
  const m = /^Bearer\s+(\S+)$/i.exec(authorization ?? "");
  if (m) return m[1];
  for (const part of (cookie ?? "").split(";")) {
    const [k, ...v] = part.trim().split("=");
    if (k === TOKEN_COOKIE) return v.join("=");
  }
  return undefined;
}

export const TOKEN_COOKIE = "armwind_token";

/**
 * A file inside the shop folder, from a path written relative to it: refused when it is absolute,
 * climbs out with "..", looks like an option, or (through a link) really lies outside.
 * Returns the relative path as given (what the CLI would be handed) and the absolute one.
 */
export function insideDir(dir: string, rel: string): { rel: string; abs: string } | Refusal {
  const outside = refuse(403, "outside_folder", `"${rel}" is not a file inside the served folder`);
  if (!rel || rel.includes("\0") || rel.startsWith("-") || isAbsolute(rel) || /^[a-zA-Z]:/.test(rel)) return outside;
  const root = resolve(dir);
  const abs = resolve(root, rel);
  const r = relative(root, abs);
  if (!r || r === ".." || r.startsWith(".." + sep) || isAbsolute(r)) return outside;
  try {
    const real = realpathSync(abs);
    const rr = relative(realpathSync(root), real);
    if (rr === ".." || rr.startsWith(".." + sep) || isAbsolute(rr)) return outside;
  } catch {
    // a file that does not exist yet: the CLI says so in its own words
  }
  return { rel, abs };
}

export const isRefusal = (x: unknown): x is Refusal => typeof x === "object" && x !== null && "status" in x && "code" in x;

/** The address to print in the link for other machines: the bound address, or this machine's first network address when bound to all. */
export function linkHost(bound: string): string {
  if (bound !== "0.0.0.0" && bound !== "::") return bound.includes(":") ? `[${bound}]` : bound;
  for (const list of Object.values(networkInterfaces())) for (const a of list ?? []) if (!a.internal && a.family === "IPv4") return a.address;
  return hostname();
}
