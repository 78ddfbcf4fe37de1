#!/usr/bin/env bash
# Instructions per call of the generated garage_co_reading() in a minimal loop
# (bench/instructions/reading_loop.c; the library's reading() in
# library_loop.cpp for comparison), counted by callgrind: deterministic for a
# given binary, unlike a timing. Prints both loops' counts and the goal; exits 1
# when the reading exceeds it (GOAL, default 60) unless WARN_ONLY=1.
#   scripts/count-instructions.sh [build/dev]
set -euo pipefail
build="${1:-build/dev}"
exe="$build/bench/instructions/counterflux_reading_loop"
lib_exe="$build/bench/instructions/counterflux_library_loop"
goal="${GOAL:-60}"
calls=100000
[ -x "$exe" ] || { echo "count-instructions: $exe not built" >&2; exit 1; }
command -v valgrind >/dev/null || { echo "count-instructions: valgrind not installed" >&2; exit 1; }
tmp="$(mktemp -d)"
trap 'rm -rf "$tmp"' EXIT
# per_call FUNCTION [EXE] [CALLS]: instructions per call of the loop FUNCTION
per_call() {
  local n="${3:-$calls}"
  valgrind --tool=callgrind --callgrind-out-file="$tmp/$1.out" --toggle-collect="$1" "${2:-$exe}" "$calls" \
    >/dev/null 2>"$tmp/$1.log"
  local total
  total="$(sed -n 's/^.*Collected : \([0-9]*\).*$/\1/p' "$tmp/$1.log")"
  [ -n "$total" ] || { cat "$tmp/$1.log" >&2; exit 1; }
  echo $(( (total + n / 2) / n ))
}
reading="$(per_call loop_reading)"
plain="$(per_call loop_plain)"
library="$(per_call loop_library "$lib_exe")"
model="$(per_call loop_model "$lib_exe" $((calls / 100 + 1)))"
echo "-- instructions per call (callgrind, -O2, loop included): garage_co_reading $reading," \
     "library counterflux::reading $library, plain bilinear kernel $plain," \
     "full model (reading_from_current, double) $model; goal for the generated reading <= $goal"
echo "-- full model / generated reading: $(( model / reading )) x; full model / library reading: $(( model / library )) x"
if [ "$reading" -gt "$goal" ]; then
  echo "-- instruction count above the goal" >&2
  [ "${WARN_ONLY:-0}" = 1 ] || exit 1
fi
