// cli stage: write a whole file at once, through a temporary file renamed into place.

import { Output } from './output.ts';

/**
 * Write text to `path` through a temporary file in the same directory, then rename it into place,
 * so an interrupted run never leaves a half-written file.
 * @throws UsageError when the directory cannot be written.
 */
export function writeFileAtomic(path: string, text: string): void {
  const output = new Output(path);
  try {
    output.write(text);
    output.close();
  } catch (error) {
    output.abort();
    throw error;
  }
}
