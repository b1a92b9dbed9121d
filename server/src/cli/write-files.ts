// Writing output files as one change: every file to a temporary file in its target's folder
// first, then each renamed over its target (rename is atomic on POSIX: IEEE Std 1003.1, rename()).
// If any step fails the files already renamed get their old text back (or are removed when they
// are new) and no temporary file is left, so a generated .c never sits beside an old .h.
// A target that is a symbolic link is written through the link (the link stays; its real file
// changes), a read-only file is refused, and an existing file keeps its permission bits.
import * as fs from 'node:fs';
import * as path from 'node:path';

export interface FileToWrite {
  file: string;
  text: string;
}

/** The renaming step, replaceable by tests to make a rename fail. */
export interface WriteOps {
  rename(from: string, to: string): void;
}

const DISK: WriteOps = { rename: (from, to) => fs.renameSync(from, to) };

interface Prepared {
  file: string;
  /** The real file written (the link's target for a link). */
  target: string;
  text: string;
  /** Bytes and permission bits of the file replaced; undefined for a new file. */
  old?: { bytes: Buffer; mode: number };
  tmp?: string;
  renamed?: boolean;
}

function message(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

/** Where a file will be written and what it holds now, or why it cannot be written. */
function prepare(f: FileToWrite): Prepared | string {
  let st: fs.Stats;
  try {
    st = fs.lstatSync(f.file);
  } catch {
    return { file: f.file, target: f.file, text: f.text };
  }
  let target = f.file;
  if (st.isSymbolicLink()) {
    try {
      target = fs.realpathSync(f.file);
      st = fs.statSync(target);
    } catch {
      return `${f.file} is a symbolic link to a file that does not exist; remove the link or point it at a file`;
    }
  }
  if (!st.isFile()) return `${f.file} is not a regular file`;
  const mode = st.mode & 0o7777;
  // Permission bits, not access(): a process run as root may write anywhere, but a file marked
  // read-only was marked so on purpose.
  if ((mode & 0o222) === 0) return `${f.file} is read-only; make it writable (or write elsewhere with --out) and run again`;
  try {
    fs.accessSync(target, fs.constants.W_OK);
    return { file: f.file, target, text: f.text, old: { bytes: fs.readFileSync(target), mode } };
  } catch (err) {
    return `${f.file} cannot be written: ${message(err)}`;
  }
}

function tempFor(target: string, k: number): string {
  return path.join(path.dirname(target), `.${path.basename(target)}.${process.pid}.${Date.now().toString(36)}.${k}.tmp`);
}

/** Writes a temporary file with `text` and `mode` (chmod after writing: the umask would narrow it). */
function writeTemp(tmp: string, data: string | Buffer, mode: number | undefined): void {
  fs.writeFileSync(tmp, data, { flag: 'wx' });
  if (mode !== undefined) fs.chmodSync(tmp, mode);
}

/** Writes all files or none; undefined when done, else why nothing was changed. */
export function writeFilesTogether(files: readonly FileToWrite[], ops: WriteOps = DISK): string | undefined {
  const prepared: Prepared[] = [];
  for (const f of files) {
    const p = prepare(f);
    if (typeof p === 'string') return p;
    prepared.push(p);
  }
  const cleanTemps = () => {
    for (const p of prepared) if (p.tmp && !p.renamed) fs.rmSync(p.tmp, { force: true });
  };
  try {
    prepared.forEach((p, k) => {
      p.tmp = tempFor(p.target, k);
      writeTemp(p.tmp, p.text, p.old?.mode);
    });
  } catch (err) {
    cleanTemps();
    return `cannot write beside ${prepared.find((p) => p.tmp && !fs.existsSync(p.tmp))?.file ?? prepared[0]?.file}: ${message(err)}`;
  }
  for (const p of prepared) {
    try {
      ops.rename(p.tmp!, p.target);
      p.renamed = true;
    } catch (err) {
      cleanTemps();
      const undone = restore(prepared.filter((x) => x.renamed));
      return `cannot replace ${p.file}: ${message(err)}${undone ? `; ${undone}` : ''}`;
    }
  }
  return undefined;
}

/** Puts back the files already renamed; a message when that fails too. */
function restore(done: Prepared[]): string | undefined {
  const failed: string[] = [];
  done.forEach((p, k) => {
    try {
      if (!p.old) {
        fs.rmSync(p.target, { force: true });
        return;
      }
      const tmp = tempFor(p.target, 1000 + k);
      try {
        writeTemp(tmp, p.old.bytes, p.old.mode);
        fs.renameSync(tmp, p.target);
      } finally {
        fs.rmSync(tmp, { force: true });
      }
    } catch (err) {
      failed.push(`${p.file} could not be put back (${message(err)})`);
    }
  });
  return failed.length ? failed.join('; ') : undefined;
}
