#!/bin/bash
# One task of a Slurm job array: solves shard $SLURM_ARRAY_TASK_ID of
# $SHARDS of a flame1d sweep into $OUT/shard-$SLURM_ARRAY_TASK_ID.
# Submit the array and the merge with submit-slurm.sh; by hand:
#   sbatch --array=0-8 --export=ALL,SHARDS=9 slurm-sweep.sh
# Two minutes before the time limit the script gets SIGTERM (--signal; exec
# makes flame1d the batch shell that receives it): it commits the
# flames in progress; resubmitting the same task resumes it:
#   sbatch --array=4 --export=ALL,SHARDS=9 slurm-sweep.sh
#SBATCH --job-name=flame1d-sweep
#SBATCH --array=0-8
#SBATCH --cpus-per-task=2
#SBATCH --mem=4G
#SBATCH --time=02:00:00
#SBATCH --signal=B:TERM@120
#SBATCH --output=flame1d-sweep-%A_%a.log
set -euo pipefail

SHARDS=${SHARDS:-9}                       # must equal the array size
CASE=${CASE:-examples/sweeps/methane-preheat-pressure.toml}
OUT=${OUT:-out}
FLAME1D=${FLAME1D:-flame1d}
I=${SLURM_ARRAY_TASK_ID:?run this script as a Slurm array task (sbatch --array=0-$((SHARDS - 1)))}

exec "$FLAME1D" sweep "$CASE" -o "$OUT/shard-$I" --shard "$I/$SHARDS" -j "${SLURM_CPUS_PER_TASK:-1}" -q
