/**
 * Writing what the user owns without ever leaving it half-written: into a temporary file beside the
 * target, then renamed into place (write-file-atomic); a failure is a located problem, exit status 3.
 */
import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import writeFileAtomic from "write-file-atomic";
import { ArmwindError } from "../errors.js";

export async function writeAtomic(file: string, data: Buffer | string): Promise<void> {
  try {
    mkdirSync(dirname(file), { recursive: true });
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
