/** What the workbench's handlers take and give: a request, a response, the JSON error shape of the CLI. */
import type { IncomingMessage } from "node:http";

/** What a handler sees: the request's method, path, query and (for changes) its body. */
export interface Req {
  method: string;
  path: string;
  query: URLSearchParams;
  body: Buffer;
  headers: IncomingMessage["headers"];
}

export interface Res {
  status: number;
  type: string;
  body: string | Buffer;
  headers?: Record<string, string>;
}

export interface Context {
  dir: string;
  maxBody: number;
}

/** A JSON error in the CLI's shape. */
export function problem(status: number, code: string, message: string, path = ""): Res {
  return json(status, { ok: false, errors: [{ code, message, file: null, line: null, column: null, path }] });
}

export function json(status: number, value: unknown): Res {
  return { status, type: "application/json; charset=utf-8", body: JSON.stringify(value, null, 2) + "\n" };
}
