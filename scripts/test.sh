#!/usr/bin/env bash
# `npm test`: every check a change must pass, in order: typecheck, lint, unit tests, integration tests,
# the production build, then the browser tests against that build.
#
# Independent steps all run even after a failure, so one run shows every problem; the browser tests need
# the build and are skipped when it failed. Each vitest run also writes its JSON report to a temporary file,
# from which the final line adds up the test counts. That line is always the last one printed:
#   Tests: N passed, M failed[, K skipped]
# The exit status is non-zero when any step failed.
set -uo pipefail

cd "$(dirname "$0")/.."

reports="$(mktemp -d)"
trap 'rm -rf "$reports"' EXIT

failed_steps=()
step_lines=()

# run_step <name> <command...>: runs a command, records its time and whether it passed.
run_step() {
  local name="$1"
  shift
  printf '\n=== %s: %s\n' "$name" "$*"
  local started=$SECONDS
  "$@"
  local status=$?
  local elapsed=$((SECONDS - started))
  if [ "$status" -eq 0 ]; then
    step_lines+=("  passed   ${name} (${elapsed} s)")
  else
    step_lines+=("  FAILED   ${name} (${elapsed} s, exit ${status})")
    failed_steps+=("$name")
  fi
  return "$status"
}

# run_vitest <project>: one vitest project, default reporter on screen, JSON report for the counts.
run_vitest() {
  local project="$1"
  run_step "$project tests" npx vitest run --project "$project" --passWithNoTests \
    --reporter=default --reporter=json --outputFile.json="$reports/$project.json"
}

run_step typecheck npx tsc --noEmit -p .
run_step lint npx eslint --max-warnings 0 .
run_vitest unit
run_vitest integration
if run_step build npx next build; then
  run_vitest browser
else
  step_lines+=("  skipped  browser tests (the build failed)")
fi

printf '\n=== Summary\n'
printf '%s\n' "${step_lines[@]}"
if [ "${#failed_steps[@]}" -gt 0 ]; then
  printf 'Failed steps: %s\n' "${failed_steps[*]}"
fi

# Adds up the JSON reports that exist (a run that crashed before reporting adds nothing, and its step
# is already marked failed above).
node --input-type=module - "$reports" <<'NODE'
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";

const directory = process.argv[2];
let passed = 0;
let failed = 0;
let skipped = 0;
for (const file of readdirSync(directory).filter((name) => name.endsWith(".json"))) {
  const report = JSON.parse(readFileSync(path.join(directory, file), "utf8"));
  passed += report.numPassedTests ?? 0;
  failed += report.numFailedTests ?? 0;
  skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
}
console.log(`Tests: ${passed} passed, ${failed} failed${skipped > 0 ? `, ${skipped} skipped` : ""}`);
NODE

[ "${#failed_steps[@]}" -eq 0 ]
