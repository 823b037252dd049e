#!/bin/bash
# Runs the sharded sweep of k8s-sweep.yaml, waits for every index to
# finish, then the merge of k8s-merge.yaml, and prints the merge's log.
# Kubernetes has no dependency between Jobs, hence the wait.
set -euo pipefail
here=$(cd "$(dirname "$0")" && pwd)
timeout=${TIMEOUT:-4h}

kubectl apply -f "$here/k8s-sweep.yaml"
# Complete when every index succeeded; Failed once an index has used up its
# retries. Either way the merge says what is there and what is missing.
kubectl wait --for=condition=complete --timeout="$timeout" job/flame1d-sweep ||
	echo "the sweep Job did not complete; merging what the shards hold" >&2
kubectl delete job/flame1d-merge --ignore-not-found
kubectl apply -f "$here/k8s-merge.yaml"
kubectl wait --for=condition=complete --timeout=30m job/flame1d-merge || true
kubectl logs job/flame1d-merge
