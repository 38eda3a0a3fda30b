#!/usr/bin/env bash
# Starts the real desktop app under Xvfb on the bundled demo and checks that a
# window appears (xdotool finds it) and that the process is still alive after
# 5 seconds. Optional: SHOT=path.png saves a screenshot.
set -euo pipefail
bin=${1:-bin/duosweep}
[ -x "$bin" ] || { echo "smoke: $bin not built (make build)" >&2; exit 1; }
disp=:$((90 + RANDOM % 9))
Xvfb "$disp" -screen 0 1400x900x24 -nolisten tcp >/tmp/duosweep-xvfb.log 2>&1 &
xpid=$!
home=$(mktemp -d)
cleanup() {
  if [ -n "${apid:-}" ]; then kill "$apid" 2>/dev/null || true; wait "$apid" 2>/dev/null || true; fi
  kill "$xpid" 2>/dev/null || true
  rm -rf "$home" 2>/dev/null || true
}
trap cleanup EXIT
sleep 2
# a fresh HOME keeps the smoke test away from the user's preferences and recovery file
DISPLAY=$disp HOME=$home LANG=en_US.UTF-8 "$bin" >/tmp/duosweep-smoke.log 2>&1 &
apid=$!
found=""
for _ in $(seq 1 30); do
  if DISPLAY=$disp xdotool search --name "Duosweep" >/dev/null 2>&1; then found=yes; break; fi
  sleep 0.5
done
if [ -z "$found" ]; then
  echo "smoke: FAIL: no Duosweep window appeared" >&2; cat /tmp/duosweep-smoke.log >&2; exit 1
fi
sleep 5
if ! kill -0 "$apid" 2>/dev/null; then
  echo "smoke: FAIL: the app exited" >&2; cat /tmp/duosweep-smoke.log >&2; exit 1
fi
if [ -n "${SHOT:-}" ]; then DISPLAY=$disp import -window root "$SHOT"; fi
echo "smoke: ok: window \"$(DISPLAY=$disp xdotool search --name Duosweep getwindowname | head -1)\" up, process alive after 5 s"
