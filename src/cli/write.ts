/**
 * Writing what the user owns without ever leaving it half-written: into a temporary file beside the
 * target, then renamed into place (write-file-atomic); a failure is a located problem, exit status 3.
 */
import { existsSync, mkdirSync, statSync } from "node:fs";
import { dirname, resolve } from "node:path";
import writeFileAtomic from "write-file-atomic";
import { ArmwindError } from "../errors.js";

export async function writeAtomic(file: string, data: Buffer | string): Promise<void> {
  try {
    makeFolders(dirname(file));
    await writeFileAtomic(file, data);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why =
      code === "EACCES" || code === "EPERM"
        ? "permission denied"
        : code === "ENOTDIR" || code === "EEXIST"
          ? "a file stands where a folder is needed"
          : code === "ENOSPC"
            ? "the disk is full"
            : code === "EROFS"
              ? "the file system is read-only"
              : (code ?? (e instanceof Error ? e.message : String(e)));
    throw new ArmwindError({ code: "write_failed", message: `cannot write ${file}: ${why}; choose another folder with -o DIR`, path: "", file }, 3);
  }
}

/**
 * Create a folder and its missing parents, one at a time. (Node 20's `mkdirSync(…, { recursive:
 * true })` spins for ever on a folder that cannot be made under /proc, where mkdir says ENOENT
 * although the parent exists; made one by one, the first refusal is an error.)
 */
export function makeFolders(dir: string): void {
  const missing: string[] = [];
  let d = resolve(dir);
  while (!existsSync(d)) {
    missing.unshift(d);
    const up = dirname(d);
    if (up === d) break;
    d = up;
  }
  for (const m of missing) {
    try {
      mkdirSync(m);
    } catch (e) {
      // made meanwhile by someone else: fine if it is a folder
      if ((e as NodeJS.ErrnoException).code !== "EEXIST" || !statSync(m).isDirectory()) throw e;
    }
  }
}

