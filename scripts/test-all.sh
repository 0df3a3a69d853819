#!/usr/bin/env bash
# `npm test`: checks the system packages the tests need, then runs typecheck, lint, jest (engine,
# server, ui) and the browser journeys, printing "stage: <name> took N s" after each and the total.
# Stops at the first failing stage with that stage's exit code.
#
# System packages (Debian names): chromium at /usr/bin/chromium for the browser journeys, and
# redis-server for the job-queue tests. When one is missing and this runs as root with apt-get, it
# installs them; otherwise it stops at once and prints the command to run.
set -uo pipefail
cd "$(dirname "$0")/.."

started=$(date +%s)

missing=()
[ -x /usr/bin/chromium ] || missing+=(chromium)
command -v redis-server >/dev/null 2>&1 || missing+=(redis-server)
if [ "${#missing[@]}" -gt 0 ]; then
  install="apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq ${missing[*]}"
  if [ "$(id -u)" -eq 0 ] && command -v apt-get >/dev/null 2>&1; then
    echo "npm test: installing missing system packages: ${missing[*]}"
    stage_start=$(date +%s)
    if ! (apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${missing[@]}" >/dev/null); then
      echo "npm test: installing ${missing[*]} failed; run as root: $install" >&2
      exit 1
    fi
    echo "stage: system packages took $(( $(date +%s) - stage_start )) s"
  else
    echo "npm test: missing system packages: ${missing[*]}. Install them, then run npm test again:" >&2
    if [ "$(id -u)" -eq 0 ]; then
      echo "  $install" >&2
    else
      echo "  sudo sh -c '$install'" >&2
    fi
    exit 1
  fi
fi

stage() {
  local name=$1
  shift
  local stage_start code
  stage_start=$(date +%s)
  "$@"
  code=$?
  echo "stage: $name took $(( $(date +%s) - stage_start )) s"
  if [ "$code" -ne 0 ]; then
    echo "npm test: stage $name failed (exit $code) after $(( $(date +%s) - started )) s in all" >&2
    exit "$code"
  fi
}

stage typecheck npx tsc --noEmit
stage lint npx eslint .
# Two workers on a two-core machine: the main jest process mostly waits on its workers.
mkdir -p .tmp
stage jest npx jest --ci --maxWorkers="${JEST_WORKERS:-2}" --json --outputFile=.tmp/jest-results.json
# Where jest's time went: each project's test files, summed over the workers.
node -e '
  const r = require(process.argv[1]);
  const by = {};
  for (const f of r.testResults) {
    const project = (/\/tests\/([^/]+)\//.exec(f.name) || [, "other"])[1];
    const p = (by[project] ??= { files: 0, ms: 0 });
    p.files++;
    p.ms += f.endTime - f.startTime;
  }
  for (const [name, p] of Object.entries(by)) console.log(`  jest project ${name}: ${p.files} files, ${Math.round(p.ms / 1000)} s of worker time`);
' "$PWD/.tmp/jest-results.json" || true
stage e2e npx tsx tests/e2e/run.ts

echo "npm test: all stages passed in $(( $(date +%s) - started )) s"
