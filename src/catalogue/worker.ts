// catalogue stage: the worker-thread entry; evaluates a batch of cluster tasks.

import { type CandidateResult, type ClusterTask, evaluateCluster } from './evaluate.ts';

/** Evaluate each task of the batch in order. */
export default function evaluateBatch(batch: ClusterTask[]): CandidateResult[][] {
  return batch.map(evaluateCluster);
}
