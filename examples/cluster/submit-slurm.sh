#!/bin/bash
# Submits a sharded flame1d sweep as a Slurm job array and a merge job that
# starts when every task of the array has ended. "afterany" rather than
# "afterok": a task that failed or ran out of time leaves the merge to say
# which shard or points are missing (resubmit those tasks, then run
# slurm-merge.sh again).
#   SHARDS=9 CASE=examples/sweeps/methane-preheat-pressure.toml OUT=out ./examples/cluster/submit-slurm.sh
set -euo pipefail

here=$(cd "$(dirname "$0")" && pwd)
export SHARDS=${SHARDS:-9}
export CASE=${CASE:-examples/sweeps/methane-preheat-pressure.toml}
export OUT=${OUT:-out}

array=$(sbatch --parsable --array=0-$((SHARDS - 1)) --export=ALL "$here/slurm-sweep.sh")
array=${array%%;*}
merge=$(sbatch --parsable --dependency=afterany:"$array" --export=ALL "$here/slurm-merge.sh")
merge=${merge%%;*}
echo "sweep array $array ($SHARDS shards of $CASE into $OUT/shard-*), merge job $merge into $OUT/merged"
