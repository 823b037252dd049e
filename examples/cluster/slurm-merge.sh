#!/bin/bash
# Joins the $SHARDS shard folders of a sweep into $OUT/merged and fits a
# flame-speed correlation to them. submit-slurm.sh runs it after the array.
# The shard folders are listed one by one (not globbed), so that a missing
# shard is named by the merge instead of silently left out.
#SBATCH --job-name=flame1d-merge
#SBATCH --cpus-per-task=1
#SBATCH --mem=1G
#SBATCH --time=00:15:00
#SBATCH --output=flame1d-merge-%j.log
set -euo pipefail

SHARDS=${SHARDS:-9}
OUT=${OUT:-out}
FLAME1D=${FLAME1D:-flame1d}

shards=()
for ((i = 0; i < SHARDS; i++)); do
	shards+=("$OUT/shard-$i")
done
"$FLAME1D" merge "${shards[@]}" -o "$OUT/merged"
"$FLAME1D" fit "$OUT/merged/results.csv" --toml "$OUT/merged/correlation.toml"
