#!/usr/bin/env bash
# The project's test command: installs what the tests need when missing, then runs every test of the solution.
set -euo pipefail
cd "$(dirname "$0")"

need=()
[ -x /usr/sbin/mosquitto ] || command -v mosquitto >/dev/null 2>&1 || need+=(mosquitto)
command -v mosquitto_pub >/dev/null 2>&1 || need+=(mosquitto-clients)
[ -x /usr/bin/chromium ] || need+=(chromium)
# systemd-analyze checks the shipped unit file (deploy/loopwatch.service).
command -v systemd-analyze >/dev/null 2>&1 || need+=(systemd)
# chattr makes the database immutable in the read-only database tests (tests/agent/Storage/StorageFaultTests.cs).
command -v chattr >/dev/null 2>&1 || need+=(e2fsprogs)
# ss shows the TCP window scaling of the agent's broker connection (tests/agent/Ingest/ConnectionTests.cs).
command -v ss >/dev/null 2>&1 || need+=(iproute2)
if [ ${#need[@]} -gt 0 ]; then
  echo "test.sh: installing ${need[*]}"
  sudo_cmd=""
  [ "$(id -u)" -eq 0 ] || sudo_cmd="sudo"
  $sudo_cmd apt-get update -q
  DEBIAN_FRONTEND=noninteractive $sudo_cmd apt-get install -y -q --no-install-recommends "${need[@]}"
fi

# Under this script a missing component fails its test instead of skipping it.
export LOOPWATCH_REQUIRE_COMPONENTS=1
export DOTNET_CLI_TELEMETRY_OPTOUT=1 DOTNET_NOLOGO=1

log=$(mktemp)
trap 'rm -f "$log"' EXIT
set +e
dotnet test LoopWatch.sln -c Release "$@" 2>&1 | tee "$log"
status=${PIPESTATUS[0]}
set -e
passed=$(grep -Eo 'Passed: +[0-9]+' "$log" | awk '{s+=$2} END {print s+0}')
failed=$(grep -Eo 'Failed: +[0-9]+' "$log" | awk '{s+=$2} END {print s+0}')
skipped=$(grep -Eo 'Skipped: +[0-9]+' "$log" | awk '{s+=$2} END {print s+0}')
echo "tests: $passed passed, $failed failed, $skipped skipped"
if [ "$status" -ne 0 ]; then exit "$status"; fi
if [ "$passed" -eq 0 ]; then echo "test.sh: no test ran" >&2; exit 1; fi
