// atlas stage: the worker-thread entry; solves one block of samples.

import { type AtlasBlock, type SolvedSample, solveBlock } from './solve.ts';

/** Solve the block's samples in order. */
export default function solveAtlasBlock(block: AtlasBlock): SolvedSample[] {
  return solveBlock(block);
}
