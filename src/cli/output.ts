/**
 * The one output routine for standard output and standard error. Written synchronously, whole,
 * straight to the descriptor, so that a failure is seen where it happens:
 *  - a reader that closes early (`armwind plan job.yaml | head`: EPIPE) ends the command quietly
 *    with status 0: the reader had what it wanted;
 *  - a full disk or another write error (ENOSPC, EIO, EFBIG…) ends it with exit status 3 and one
 *    line on standard error (docs/contracts.md: 3, a file could not be written).
 * A non-blocking pipe (EAGAIN) is waited on.
 */
import { writeSync } from "node:fs";

/** Standard output or error could not be written; `closed` when the reader went away (EPIPE). */
export class OutputError extends Error {
  readonly closed: boolean;
  readonly code: string;
  readonly fd: number;
  constructor(fd: number, code: string) {
    super(`cannot write to standard ${fd === 2 ? "error" : "output"} (${code})`);
    this.name = "OutputError";
    this.fd = fd;
    this.code = code;
    this.closed = code === "EPIPE" || code === "ECONNRESET";
  }
}

function sleepSync(ms: number): void {
  Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, ms);
}

/** Write all of `text` to `fd` (1 or 2); throws OutputError when it cannot. */
export function writeStream(fd: number, text: string): void {
  const buf = Buffer.from(text, "utf8");
  let off = 0;
  let waits = 0;
  while (off < buf.length) {
    try {
      off += writeSync(fd, buf, off, buf.length - off);
      waits = 0;
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code ?? "error";
      // a reader that does not read for a minute is as good as gone
      if (code === "EAGAIN" && waits++ < 60_000) {
        sleepSync(1);
        continue;
      }
      throw new OutputError(fd, code === "EAGAIN" ? "EPIPE" : code);
    }
  }
}

/** The one line for an output that failed (not for a closed pipe, which ends quietly). */
export function outputFailedLine(e: OutputError): string {
  const why =
    e.code === "ENOSPC" ? "the disk is full" : e.code === "EDQUOT" ? "the disk quota is exhausted" : e.code === "EFBIG" ? "the file is too large" : e.code;
  return `armwind: cannot write to standard ${e.fd === 2 ? "error" : "output"}: ${why} [write_failed]\n`;
}

/**
 * End the command for an output error: 0 for a reader that closed early (nothing more to say),
 * 3 for a write that failed, with one line on standard error (when standard error itself works).
 */
export function endForOutputError(e: OutputError): number {
  if (e.closed) return 0;
  if (e.fd !== 2) {
    try {
      writeStream(2, outputFailedLine(e));
    } catch {
      /* standard error is gone too: the status says it */
    }
  }
  return 3;
}
