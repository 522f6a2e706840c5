/**
 * Writing what the user owns without ever leaving it half-written: into a temporary file beside the
 * target (hidden, named with this host and process id: src/files.ts), flushed, then renamed into
 * place. A rename replaces the directory entry itself: a symbolic link at the final name is
 * replaced by the new file, never written through (the file it points to is left alone). Leftovers
 * of this host's killed writers are removed as the next write starts. A failure is a located
 * problem, exit status 3.
 */
import { closeSync, fsyncSync, openSync, renameSync, unlinkSync, writeSync } from "node:fs";
import { basename, dirname } from "node:path";
import { ArmwindError } from "../errors.js";
import { makeFolders, removeLeftovers, tempName } from "../files.js";

function whyNotWritten(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  return code === "EACCES" || code === "EPERM"
    ? "permission denied"
    : code === "ENOTDIR" || code === "EEXIST"
      ? "a file stands where a folder is needed"
      : code === "EISDIR"
        ? "a folder stands at that name"
        : code === "ENOSPC" || code === "EDQUOT"
          ? "the disk is full"
          : code === "EROFS"
            ? "the file system is read-only"
            : (code ?? (e instanceof Error ? e.message : String(e)));
}

/** Write `data` to `file` atomically (temporary file, fsync, rename); never through a symlink at `file`. */
export async function writeAtomic(file: string, data: Buffer | string): Promise<void> {
  const dir = dirname(file);
  let tmp: string | null = null;
  try {
    makeFolders(dir);
    removeLeftovers(dir);
    tmp = tempName(dir, basename(file));
    // "wx": the temporary name is new (O_EXCL never follows a symlink planted there)
    const fd = openSync(tmp, "wx", 0o644);
    try {
      const buf = typeof data === "string" ? Buffer.from(data, "utf8") : data;
      let off = 0;
      while (off < buf.length) off += writeSync(fd, buf, off, buf.length - off);
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    renameSync(tmp, file);
    tmp = null;
  } catch (e) {
    throw new ArmwindError(
      { code: "write_failed", message: `cannot write ${file}: ${whyNotWritten(e)}; choose another folder with -o DIR`, path: "", file },
      3,
    );
  } finally {
    if (tmp !== null) {
      try {
        unlinkSync(tmp);
      } catch {
        /* never made, or gone */
      }
    }
  }
}

export { makeFolders } from "../files.js";
