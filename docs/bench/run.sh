#!/bin/sh
# Times fogbench against the numpy/scipy reference (docs/bench/reference.py)
# on one seeded batch of 1,000 varied cases, both as whole processes writing
# their full results as JSON, and prints the time ratio and the agreement.
# Run from the repository root:  sh docs/bench/run.sh [-n 1000] [-seed 1] [-runs 3]
set -eu
exec go run ./testdata/bench "$@"
