// cli stage: where a run's results go. Standard output is written through its stream with backpressure;
// files are declared (and checked) before any work, written to temporary names beside them, and renamed
// into place together once every one of them is whole. A symbolic link is followed and the file it names
// is replaced; a FIFO or a device is written through. Temporary files of a run that is stopped by a
// signal are removed by the binary (cli/lather.ts, through removeTemporaryFiles).

import { closeSync, constants, fsyncSync, lstatSync, openSync, realpathSync, renameSync, rmSync, statSync, writeSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { LatherError, UsageError } from '../errors.ts';
import { cliStreams, streamFailure, writeFailure } from './streams.ts';

/** A result that could not be written (a full disk, a closed device): one line, exit status 2. */
export class OutputError extends LatherError {
  override name = 'OutputError';
}

/** Temporary files of every run in progress, removed on a signal. */
const temporaryFiles = new Set<string>();

/** Remove every temporary file a run in progress has open (for signal handlers). */
export function removeTemporaryFiles(): void {
  for (const path of temporaryFiles) rmSync(path, { force: true });
  temporaryFiles.clear();
}

/** One output file of a run. */
export class OutputFile {
  /** The path given by the user (for messages). */
  readonly given: string;
  /** The file that is written: the given path with symbolic links followed. */
  readonly target: string;
  /** Written to directly (a FIFO or a device): no temporary file. */
  private readonly through: boolean;
  private readonly tmp: string | null;
  private fd = -1;

  constructor(given: string, target: string, through: boolean) {
    this.given = given;
    this.target = target;
    this.through = through;
    this.tmp = through ? null : join(dirname(target), `.${basename(target)}.${process.pid}.${Math.random().toString(36).slice(2, 8)}.tmp`);
  }

  /** Create the temporary file (a FIFO or device is opened when first written). @throws UsageError. */
  open(): void {
    if (this.tmp === null) return;
    try {
      this.fd = openSync(this.tmp, constants.O_WRONLY | constants.O_CREAT | constants.O_EXCL, 0o666);
      temporaryFiles.add(this.tmp);
    } catch (error) {
      throw new UsageError(`Cannot write ${this.given} (${(error as NodeJS.ErrnoException).code ?? 'error'}) when expected a file in a writable folder.`);
    }
  }

  /** Append text (or bytes). @throws OutputError when it cannot be written. */
  write(text: string | Uint8Array): void {
    try {
      if (this.fd === -1) this.fd = openSync(this.target, 'w');
      const bytes = typeof text === 'string' ? Buffer.from(text) : text;
      let offset = 0;
      while (offset < bytes.length) offset += writeSync(this.fd, bytes, offset);
    } catch (error) {
      throw new OutputError(`Cannot write ${this.given} (${writeFailure(error)}).`);
    }
  }

  /** Make the contents durable (the rename comes later). @throws OutputError. */
  finish(): void {
    try {
      if (this.fd === -1) this.fd = openSync(this.tmp ?? this.target, 'w');
      if (this.tmp !== null) fsyncSync(this.fd);
      closeSync(this.fd);
      this.fd = -1;
    } catch (error) {
      throw new OutputError(`Cannot write ${this.given} (${writeFailure(error)}).`);
    }
  }

  /** Put the finished file in place. */
  rename(): void {
    if (this.tmp === null) return;
    try {
      renameSync(this.tmp, this.target);
      temporaryFiles.delete(this.tmp);
    } catch (error) {
      throw new OutputError(`Cannot write ${this.given} (${writeFailure(error)}).`);
    }
  }

  /** Give up: close and remove the temporary file; the old file stays as it was. */
  abort(): void {
    if (this.fd !== -1) {
      try {
        closeSync(this.fd);
      } catch {
        // already closed
      }
      this.fd = -1;
    }
    if (this.tmp !== null) {
      rmSync(this.tmp, { force: true });
      temporaryFiles.delete(this.tmp);
    }
  }
}

/** What is at a path: nothing, a regular file (with symbolic links followed), or something else. */
function existing(path: string): { kind: 'none' } | { kind: 'file'; real: string } | { kind: 'folder' } | { kind: 'other' } {
  try {
    lstatSync(path);
  } catch {
    return { kind: 'none' };
  }
  let stats;
  try {
    stats = statSync(path);
  } catch {
    throw new UsageError(`Output ${path} is a symbolic link to nothing when expected a file path or a link to a file.`);
  }
  if (stats.isDirectory()) return { kind: 'folder' };
  // a FIFO, a device or a terminal (also through a link such as /dev/stdout) is written through
  return stats.isFile() ? { kind: 'file', real: realpathSync(path) } : { kind: 'other' };
}

/**
 * The output files of one run. Declare every output with add() before the work starts (each path is
 * checked then, and its temporary file created); write; then commit() puts them all in place, or
 * abort() removes them all and leaves every old file as it was.
 */
export class RunFiles {
  private readonly files: OutputFile[] = [];
  private readonly inputs: Map<string, string>;

  /** `inputs`: files the run reads, which no output may replace. */
  constructor(inputs: readonly string[] = []) {
    this.inputs = new Map();
    for (const input of inputs) {
      const found = existing(input);
      if (found.kind === 'file') this.inputs.set(found.real, input);
    }
  }

  /**
   * Declare an output file given with `option`. @throws UsageError when the path is empty, a folder, in
   * a folder that does not exist or cannot be written, one of the run's inputs, or another output's.
   */
  add(path: string, option: string): OutputFile {
    if (path.trim() === '') throw new UsageError(`Option ${option} is empty when expected a file path.`);
    const found = existing(path);
    if (found.kind === 'folder') throw new UsageError(`Output ${path} (${option}) is a folder when expected a file path.`);
    const through = found.kind === 'other';
    const target = found.kind === 'file' ? found.real : resolve(path);
    const input = this.inputs.get(target);
    if (input !== undefined) throw new UsageError(`Output ${path} (${option}) is the input ${input} when expected a different file.`);
    const twin = this.files.find((f) => f.target === target);
    if (twin !== undefined) throw new UsageError(`Output ${path} (${option}) is also the output ${twin.given} when expected a different file.`);
    if (found.kind === 'none') {
      let folder;
      try {
        folder = statSync(dirname(target));
      } catch {
        folder = null;
      }
      if (folder === null || !folder.isDirectory()) {
        throw new UsageError(`Output ${path} (${option}) is in a folder that does not exist when expected a path in an existing folder.`);
      }
    }
    const file = new OutputFile(path, target, through);
    file.open();
    this.files.push(file);
    return file;
  }

  /** Finish every file, then rename each into place. @throws OutputError (every temporary file removed). */
  commit(): void {
    try {
      for (const f of this.files) f.finish();
      for (const f of this.files) f.rename();
    } catch (error) {
      this.abort();
      throw error;
    }
  }

  /** Remove every temporary file; old files stay as they were. */
  abort(): void {
    for (const f of this.files) f.abort();
  }

  /** Give up one output (nothing to write after all): its old file stays as it was. */
  discard(file: OutputFile): void {
    file.abort();
    this.files.splice(this.files.indexOf(file), 1);
  }
}

/**
 * Run `work` with the output files `declare` adds (all checked before the work starts); commit them all
 * when the work succeeds, remove them all when it fails. Returns what the work returns, once the files
 * are in place.
 */
export async function withRunFiles<D, R>(
  inputs: readonly string[], declare: (files: RunFiles) => D, work: (outputs: D, files: RunFiles) => Promise<R> | R,
): Promise<R> {
  const files = new RunFiles(inputs);
  try {
    const outputs = declare(files);
    const result = await work(outputs, files);
    files.commit();
    return result;
  } catch (error) {
    files.abort();
    throw error;
  }
}

/** Where text goes: an output file, or the run's standard output when there is none. */
export type TextSink = OutputFile | null;

/** A line-oriented writer on a sink, buffered, that waits for a slow reader of standard output. */
export class Output {
  private readonly file: TextSink;
  private buffer: string[] = [];
  private size = 0;

  constructor(file: TextSink) {
    this.file = file;
  }

  /** Append one line (a newline is added). */
  line(text: string): void {
    this.write(text + '\n');
  }

  /** Append text as it is. */
  write(text: string): void {
    this.buffer.push(text);
    this.size += text.length;
    if (this.size > 1 << 16) this.flush();
  }

  /** Hand the buffer on: to the file, or to standard output's stream (which queues what is not read yet). */
  flush(): void {
    if (this.buffer.length === 0) return;
    const text = this.buffer.join('');
    this.buffer = [];
    this.size = 0;
    if (this.file !== null) this.file.write(text);
    else writeOut(text);
  }

  /** Wait while standard output's reader is behind (memory stays flat however slow it reads). */
  async ready(): Promise<void> {
    if (this.file === null) await outputReady();
  }
}

/** Write text to the run's standard output. @throws the stream's failure, if it has failed. */
export function writeOut(text: string): void {
  const failure = streamFailure();
  if (failure !== null) throw failure;
  cliStreams().out.write(text);
}

/** Resolves when standard output's stream has room again. @throws the stream's failure. */
export async function outputReady(): Promise<void> {
  const out = cliStreams().out as NodeJS.WritableStream & { writableNeedDrain?: boolean };
  if (out.writableNeedDrain) {
    await new Promise<void>((done) => {
      const finish = () => {
        out.off('drain', finish);
        out.off('error', finish);
        out.off('close', finish);
        done();
      };
      out.on('drain', finish);
      out.on('error', finish);
      out.on('close', finish);
    });
  }
  const failure = streamFailure();
  if (failure !== null) throw failure;
}
