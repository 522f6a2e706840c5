/**
 * `armwind serve`'s HTTP server (node:http, no framework): every request passes the gate (Host,
 * token, Origin, body size), then goes to the API (JSON, the CLI's own output) or to a page.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import { resolve } from "node:path";
import { allowedHosts, checkHost, checkOrigin, isLoopback, makeToken, presentedToken, tokenMatches, TOKEN_COOKIE, type Refusal } from "./guard.js";
import { handleApi } from "./api.js";
import { handlePage } from "./pages.js";
import { problem, type Context, type Req, type Res } from "./respond.js";

export const DEFAULT_MAX_BODY = 1 << 20;

export interface ServeOptions {
  /** The shop folder served (absolute or relative to the process's working folder). */
  dir: string;
  port: number;
  host: string;
  allowHost?: string[];
  /** Largest request body accepted, in bytes (default 1 MiB; a job file is a few kB). */
  maxBody?: number;
  /** Fixed token (tests); else a random one when serving the network. */
  token?: string;
}

export interface Served {
  server: Server;
  url: string;
  /** The token when serving the network, else null. */
  token: string | null;
  close: () => Promise<void>;
}

const fromRefusal = (r: Refusal) => problem(r.status, r.code, r.message);

/** Read the body, refusing (413) one larger than the cap without reading the rest. */
function readBody(req: IncomingMessage, max: number): Promise<Buffer | undefined> {
  return new Promise((done, fail) => {
    const declared = Number(req.headers["content-length"] ?? 0);
    if (declared > max) return done(undefined);
    const chunks: Buffer[] = [];
    let size = 0;
    req.on("data", (c: Buffer) => {
      size += c.length;
      if (size > max) {
        req.removeAllListeners("data");
        req.resume();
        done(undefined);
      } else chunks.push(c);
    });
    req.on("end", () => done(Buffer.concat(chunks)));
    req.on("error", fail);
  });
}

function send(res: ServerResponse, r: Res): void {
  res.writeHead(r.status, {
    "content-type": r.type,
    "cache-control": "no-store",
    "x-content-type-options": "nosniff",
    "x-frame-options": "DENY",
    "referrer-policy": "no-referrer",
    "content-security-policy": "default-src 'self'; img-src 'self' data:; style-src 'self'; script-src 'self'; frame-ancestors 'none'",
    ...r.headers,
  });
  res.end(r.body);
}

/** The gate: Host, token, Origin. Returns a response to send instead, or undefined to go on. */
function gate(req: IncomingMessage, url: URL, allowed: Set<string>, token: string | null): Res | undefined {
  const host = req.headers.host;
  const badHost = checkHost(host, allowed);
  if (badHost) return fromRefusal(badHost);
  if (token) {
    const q = url.searchParams.get("token");
    if (q !== null && tokenMatches(q, token) && (req.method === "GET" || req.method === "HEAD")) {
      // the printed link: turn the token into a same-site, HTTP-only cookie and drop it from the address
      url.searchParams.delete("token");
      return {
        status: 303,
        type: "text/plain; charset=utf-8",
        body: "",
        headers: { location: url.pathname + url.search, "set-cookie": `${TOKEN_COOKIE}=${token}; HttpOnly; SameSite=Strict; Path=/` },
      };
    }
    if (!tokenMatches(presentedToken(req.headers.authorization, req.headers.cookie), token)) {
      return problem(
        401,
        "token_required",
        "this workbench serves the network: open the link it printed when it started (it carries the token), or send Authorization: Bearer <token>",
      );
    }
  }
  const origin = typeof req.headers.origin === "string" ? req.headers.origin : undefined;
  const site = typeof req.headers["sec-fetch-site"] === "string" ? req.headers["sec-fetch-site"] : undefined;
  const badOrigin = checkOrigin(req.method ?? "GET", origin, site, host, allowed);
  return badOrigin ? fromRefusal(badOrigin) : undefined;
}

async function handle(req: IncomingMessage, ctx: Context, allowed: Set<string>, token: string | null): Promise<Res> {
  let url: URL;
  try {
    url = new URL(req.url ?? "/", "http://workbench.invalid");
  } catch {
    return problem(400, "bad_request", "the request's address cannot be read");
  }
  const refused = gate(req, url, allowed, token);
  if (refused) return refused;
  const method = req.method ?? "GET";
  let body: Buffer = Buffer.alloc(0);
  if (method !== "GET" && method !== "HEAD") {
    const b = await readBody(req, ctx.maxBody);
    if (!b) return problem(413, "body_too_large", `the request body is larger than ${ctx.maxBody} bytes; a job or measured file is a few kilobytes`);
    body = b;
  }
  let path: string;
  try {
    path = decodeURIComponent(url.pathname);
  } catch {
    return problem(400, "bad_request", "the request's path is not valid percent-encoding");
  }
  const r: Req = { method, path, query: url.searchParams, body, headers: req.headers };
  if (path.startsWith("/api/")) return handleApi(r, ctx);
  return handlePage(r, ctx);
}

/** Start the workbench; resolves once it listens. */
export function serve(opts: ServeOptions): Promise<Served> {
  const ctx: Context = { dir: resolve(opts.dir), maxBody: opts.maxBody ?? DEFAULT_MAX_BODY };
  const network = !isLoopback(opts.host);
  const token = network ? (opts.token ?? makeToken()) : null;
  let allowed = allowedHosts(opts.host, network, opts.allowHost);
  const server = createServer((req, res) => {
    handle(req, ctx, allowed, token).then(
      (r) => send(res, r),
      (e: unknown) => send(res, problem(500, "internal_error", e instanceof Error ? e.message : String(e))),
    );
  });
  // a tablet may sit idle between readings: keep its connection longer than Node's 5 s default, so a
  // request sent on a connection the server is just closing is rare
  server.keepAliveTimeout = 65_000;
  return new Promise((done, fail) => {
    server.once("error", fail);
    server.listen(opts.port, opts.host, () => {
      const a = server.address();
      const port = typeof a === "object" && a ? a.port : opts.port;
      const shownHost = opts.host.includes(":") ? `[${opts.host}]` : opts.host;
      allowed = allowedHosts(opts.host, network, opts.allowHost);
      done({
        server,
        url: `http://${shownHost}:${port}/`,
        token,
        close: () =>
          new Promise((c) => {
            server.close(() => c());
            server.closeAllConnections();
          }),
      });
    });
  });
}
