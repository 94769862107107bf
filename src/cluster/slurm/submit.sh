#!/bin/bash
# Submits Hairline's sharded scoring to Slurm: a job array of N shards, then the merge as a job that
# starts when every shard has succeeded. Prints the two job ids; results land in OUT/merged.
#   src/cluster/slurm/submit.sh [--wait] N OUT --truth DIR --pred A=DIR [--pred B=DIR] [other score options]
# --wait returns only when the merge has finished (its exit status is the merge's).
# Extra sbatch options (partition, account, time) go in SBATCH_* variables, e.g. SBATCH_PARTITION=gpu.
set -euo pipefail
here="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
wait=()
if [[ "${1:-}" == "--wait" ]]; then wait=(--wait); shift; fi
n="${1:?usage: submit.sh [--wait] N OUT SCORE-ARGS…}"
out="${2:?usage: submit.sh [--wait] N OUT SCORE-ARGS…}"
shift 2
if ! [[ "$n" =~ ^[1-9][0-9]*$ ]]; then echo "submit.sh: N must be a whole number ≥ 1, got \"$n\"" >&2; exit 1; fi
export HAIRLINE_ROOT="${HAIRLINE_ROOT:-$(cd "$here/../../.." && pwd)}"
mkdir -p "$out"
out="$(cd "$out" && pwd)"
array=$(sbatch --parsable --array="0-$((n - 1))" --chdir="$out" "$here/score-array.sbatch" "$out" "$@")
array="${array%%;*}"
echo "scoring: job array $array ($n shards) -> $out/part-0 … part-$((n - 1))"
merge=$(sbatch --parsable "${wait[@]}" --chdir="$out" --dependency="afterok:$array" --kill-on-invalid-dep=yes "$here/merge.sbatch" "$out" "$n")
echo "merge: job ${merge%%;*} (after $array) -> $out/merged"
