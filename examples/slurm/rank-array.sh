#!/usr/bin/env bash
# A ranking cut into one shard per task of a Slurm job array, then merged (see README, "Many machines").
#
#   sbatch --array=1-4 examples/slurm/rank-array.sh "1,1,1,1,1,1,1" parts/equal-7
#   lather merge parts/equal-7.part*.json --out equal-7.json       # once every task has finished
#
# Each task ranks its shard (lather reads SLURM_ARRAY_TASK_ID, SLURM_ARRAY_TASK_MIN and
# SLURM_ARRAY_TASK_COUNT with --shard slurm) on the cores Slurm gave it, and writes one part file.
#SBATCH --job-name=lather-rank
#SBATCH --cpus-per-task=1
#SBATCH --output=lather-rank-%A_%a.log
set -euo pipefail
areas=${1:?usage: rank-array.sh AREAS PREFIX (e.g. "1,1,1,1,1" parts/equal-5)}
prefix=${2:?usage: rank-array.sh AREAS PREFIX}
lather=${LATHER:-lather}
mkdir -p "$(dirname "$prefix")"
$lather rank --areas "$areas" --shard slurm --workers "${SLURM_CPUS_PER_TASK:-1}" \
  --out "$prefix.part${SLURM_ARRAY_TASK_ID}.json"
