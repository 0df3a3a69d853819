/**
 * Output files of the CLI. A file is written whole or not at all: the text goes to a temporary
 * file in the same folder, which is renamed over the target only when complete, so a failed run
 * never leaves a partial file behind. Without a path (or with "-") the text goes to stdout.
 */
import { existsSync, renameSync, statSync, unlinkSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { CliInputError } from './args';

/** Checks early, before any work, that `path` can be written (its folder exists). */
export function checkOutputPath(path: string | undefined, option: string): void {
  if (path === undefined || path === '-') return;
  const folder = dirname(resolve(path));
  if (!existsSync(folder) || !statSync(folder).isDirectory()) {
    throw new CliInputError(`--${option}=${path}: folder "${folder}" does not exist`);
  }
  if (existsSync(path) && statSync(path).isDirectory()) {
    throw new CliInputError(`--${option}=${path} is a folder, not a file`);
  }
}

/** Writes `text` to `path` through a temporary file in the same folder and a rename. */
export function writeFileAtomic(path: string, text: string): void {
  const target = resolve(path);
  const temporary = join(dirname(target), `.${basename(target)}.${process.pid}.${Date.now()}.tmp`);
  try {
    writeFileSync(temporary, text, 'utf8');
    renameSync(temporary, target);
  } catch (error) {
    if (existsSync(temporary)) unlinkSync(temporary);
    throw new CliInputError(`cannot write "${path}": ${(error as Error).message}`);
  }
}

/** Writes several files as one step: all temporaries first, then the renames. */
export function writeFilesAtomic(files: { path: string; text: string }[]): void {
  const staged: { temporary: string; target: string }[] = [];
  try {
    for (const file of files) {
      const target = resolve(file.path);
      const temporary = join(dirname(target), `.${basename(target)}.${process.pid}.${Date.now()}.tmp`);
      writeFileSync(temporary, file.text, 'utf8');
      staged.push({ temporary, target });
    }
    for (const { temporary, target } of staged) renameSync(temporary, target);
  } catch (error) {
    for (const { temporary } of staged) if (existsSync(temporary)) unlinkSync(temporary);
    throw new CliInputError(`cannot write output: ${(error as Error).message}`);
  }
}

/** Sends `text` to a file (atomically) or, without a path or with "-", to stdout. */
export function emit(path: string | undefined, text: string): void {
  if (path === undefined || path === '-') process.stdout.write(text);
  else writeFileAtomic(path, text);
}

/** Writes the files (all or none) and then the main text to `mainPath` or stdout. */
export function writeOutputs(files: { path: string; text: string }[], mainPath: string | undefined, mainText: string): void {
  if (mainPath === undefined || mainPath === '-') {
    writeFilesAtomic(files);
    process.stdout.write(mainText);
  } else {
    writeFilesAtomic([...files, { path: mainPath, text: mainText }]);
  }
}
