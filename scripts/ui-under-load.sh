#!/usr/bin/env bash
# Runs the UI jest project several times in a row while other processes keep the CPU busy, to
# show that no UI test depends on how fast the machine is. Prints each run's pass/fail counts and
# exits non-zero if any run had a failure.
#
#   npm run test:ui-load                 # 3 runs beside 2 CPU burners
#   RUNS=5 BURNERS=4 npm run test:ui-load -- tests/ui/sign-in.test.tsx
#
# Extra arguments go to jest. The burners are stopped on success, failure and Ctrl-C.
set -uo pipefail
cd "$(dirname "$0")/.."

runs=${RUNS:-3}
burners=${BURNERS:-2}
out=.tmp/ui-under-load
mkdir -p "$out"

pids=()
stop_burners() {
  for pid in "${pids[@]}"; do kill "$pid" 2>/dev/null || true; done
  for pid in "${pids[@]}"; do wait "$pid" 2>/dev/null || true; done
  pids=()
}
trap stop_burners EXIT
trap 'echo "interrupted"; exit 130' INT TERM

for _ in $(seq "$burners"); do
  (while :; do :; done) &
  pids+=("$!")
done
echo "started $burners CPU burners (pids ${pids[*]}) on $(nproc) cores; load average: $(cut -d' ' -f1-3 /proc/loadavg)"

failed_runs=0
summary=()
for run in $(seq "$runs"); do
  report="$out/run-$run.json"
  rm -f "$report"
  start=$(date +%s)
  npx jest "$@" --selectProjects ui --ci --json --outputFile="$report" >"$out/run-$run.log" 2>&1
  code=$?
  took=$(( $(date +%s) - start ))
  load=$(cut -d' ' -f1-3 /proc/loadavg)
  failing=""
  if [ -s "$report" ]; then
    counts=$(node -e '
      const r = require(process.argv[1]);
      console.log(`passed ${r.numPassedTests}, failed ${r.numFailedTests}, suites failed ${r.numFailedTestSuites}`);
    ' "$PWD/$report")
    failing=$(node -e '
      const r = require(process.argv[1]);
      for (const f of r.testResults) {
        if (f.status === "failed" && f.assertionResults.every((a) => a.status !== "failed")) console.log("    " + f.name.replace(process.cwd() + "/", "") + " (the file did not run)");
        for (const a of f.assertionResults) if (a.status === "failed") console.log("    " + f.name.replace(process.cwd() + "/", "") + " › " + a.fullName);
      }
    ' "$PWD/$report")
  else
    counts="no report"
  fi
  line="run $run: $counts; jest exit $code; ${took} s; load average $load"
  echo "$line"
  [ -z "$failing" ] || echo "$failing"
  summary+=("$line")
  [ "$code" -eq 0 ] || failed_runs=$(( failed_runs + 1 ))
done

stop_burners
echo "---"
printf '%s\n' "${summary[@]}"
if [ "$failed_runs" -gt 0 ]; then
  echo "FAILED: $failed_runs of $runs runs had failures (logs in $out/)"
  exit 1
fi
echo "OK: $runs of $runs runs passed"
