#!/usr/bin/env bash
# Runs the harness on nanoFramework's interpreter (its POSIX build): converts the core
# (LaunchLogger.Firmware.Nano.dll, built by the NanoCheck gate) and the harness with the
# metadata processor, runs them after the device's mscorlib.pe, and prints the harness's lines.
#
#   NANOCLR_POSIX            path of nanoFramework.nanoCLR.test (nf-interpreter, targets/posix)
#   NANO_METADATA_PROCESSOR  the metadata processor, as a command taking its console's options
#                            (-loadHints NAME PATH, -parse DLL, -compile PE false)
#
# Usage: run-on-nanoclr.sh [Debug|Release] [work folder]   build Device/ first (dotnet build)
#        run-on-nanoclr.sh --counts FILE   summarises the step markers of a run on an
#                                          interpreter built with instruction and allocation
#                                          counters (see DEVELOPERS.md), FILE being its raw output
# Nothing waits for input; the interpreter exits 0 even when Main dies, so judge by the output.
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"

if [ "${1:-}" = "--counts" ]; then
  # Markers: "#a il=N obj=M" before a pass, "#b ..." after it, then three "#k" lines saying
  # whether the pass saw a new observation (o), read accelerometer samples (a), wrote frames (f).
  # The first two #a/#b pairs have nothing between them and calibrate the markers' own cost.
  tr -d '\r' < "$2" | awk '
    /^#a il=/ { split($2,x,"="); split($3,y,"="); ia=x[2]; oa=y[2]; next }
    /^#b il=/ { split($2,x,"="); split($3,y,"="); di=x[2]-ia; dob=y[2]-oa; pairs++
                if (pairs <= 2) { ci=di; co=dob; next }
                di-=ci; dob-=co; k=0; step++; next }
    /^#k / { if (pairs <= 2) next; k++; flag[k]=$2
             if (k < 3) next
             cls = (flag[2]=="a") ? "accelerometer read" : (flag[3]=="f") ? "frames written" : (flag[1]=="o") ? "observation" : "idle"
             n[cls]++; s[cls]+=di; if (di>m[cls]) m[cls]=di
             allocs+=dob; if (dob>ma) ma=dob
             if (di>big) { big=di; bigcls=cls } }
    END {
      printf "steps %d (marker cost %d IL, %d allocations, subtracted)\n", step, ci, co
      for (c in n) printf "%-20s %6d steps  mean %6.0f IL  max %6d IL\n", c, n[c], s[c]/n[c], m[c]
      printf "largest single step %d IL (%s)\n", big, bigcls
      printf "allocations: %d in all steps, at most %d in one step\n", allocs, ma
      printf "at 0.4-1.5 us per IL instruction: idle pass %.2f-%.2f ms, largest pass %.1f-%.1f ms\n", s["idle"]/n["idle"]*0.0004, s["idle"]/n["idle"]*0.0015, big*0.0004, big*0.0015
    }'
  exit 0
fi

configuration="${1:-Debug}"
work="${2:-$(mktemp -d)}"
: "${NANOCLR_POSIX:?set NANOCLR_POSIX to the interpreter (nanoFramework.nanoCLR.test)}"
: "${NANO_METADATA_PROCESSOR:?set NANO_METADATA_PROCESSOR to the metadata processor command}"
bin="$here/Device/bin/$configuration/netstandard2.0"
for f in mscorlib.dll mscorlib.pe LaunchLogger.Firmware.Nano.dll LaunchLogger.Firmware.NanoHarness.dll; do
  [ -f "$bin/$f" ] || { echo "missing $bin/$f: dotnet build $here/Device -c $configuration" >&2; exit 2; }
done
mkdir -p "$work"
# shellcheck disable=SC2086  # the command may carry its own arguments (dotnet tool.dll)
$NANO_METADATA_PROCESSOR -loadHints mscorlib "$bin/mscorlib.dll" \
  -parse "$bin/LaunchLogger.Firmware.Nano.dll" -compile "$work/LaunchLogger.Firmware.Nano.pe" false >&2
# shellcheck disable=SC2086
$NANO_METADATA_PROCESSOR -loadHints mscorlib "$bin/mscorlib.dll" \
  -loadHints LaunchLogger.Firmware.Nano "$bin/LaunchLogger.Firmware.Nano.dll" \
  -parse "$bin/LaunchLogger.Firmware.NanoHarness.dll" -compile "$work/LaunchLogger.Firmware.NanoHarness.pe" false >&2
(cd "$work" && timeout 600 "$NANOCLR_POSIX" "$bin/mscorlib.pe" LaunchLogger.Firmware.Nano.pe LaunchLogger.Firmware.NanoHarness.pe \
  < /dev/null > raw-output.txt 2>&1) || true
# The harness's lines: from its first line to its last, without the loader's chatter.
tr -d '\r' < "$work/raw-output.txt" | awk '/^harness [0-9]+$/ { on=1 } on { print } on && /^done$/ { exit }'
