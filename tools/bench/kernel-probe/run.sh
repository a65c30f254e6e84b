#!/usr/bin/env bash
# Side by side in one run: the Java rank-k kernel of lariat.moments (as the JIT compiles it) and a
# register-tiled AVX2 kernel in C (rank_update.c) on the same panel shapes. A probe for deciding whether a
# native kernel would pay; nothing here is part of the build. Needs gcc and a built processor module
# (mvn -B -q -pl processor package -DskipTests). Usage: tools/bench/kernel-probe/run.sh [WIDTH ...]
set -euo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
root="$(cd "$here/../../.." && pwd)"
classes="$root/processor/target/classes"
[ -d "$classes/lariat/moments" ] || { echo "build the processor module first: mvn -B -q -pl processor package -DskipTests" >&2; exit 2; }
work="$(mktemp -d)"
trap 'rm -rf "$work"' EXIT
gcc -O3 -mavx2 -mfma -ffp-contract=off -o "$work/rank_update" "$here/rank_update.c" -lm
javac -d "$work" -cp "$classes" "$here/KernelProbe.java"
grep -q avx2 /proc/cpuinfo || { echo "this processor has no AVX2" >&2; exit 2; }
widths=("$@")
[ ${#widths[@]} -gt 0 ] || widths=(33 101 201 1001)
echo "machine: $(nproc) processors, $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ *//'); $(java -version 2>&1 | head -1)"
printf '%6s %6s %14s %14s %12s %12s %8s\n' width rows java_us_panel c_us_panel java_gfma_s c_gfma_s c/java
for d in "${widths[@]}"; do
  read -r _ ju jg < <(java -cp "$work:$classes" lariat.moments.KernelProbe "$d" 256)
  read -r _ cu cg < <("$work/rank_update" "$d" 256)
  printf '%6s %6s %14s %14s %12s %12s %8.2f\n' "$d" 256 "$ju" "$cu" "$jg" "$cg" "$(echo "$cg / $jg" | bc -l)"
done
if /usr/bin/python3 -c 'import numpy' 2>/dev/null; then
  echo "for comparison, numpy z.T @ z (BLAS syrk) on 200 000 rows (8 000 above width 500), one BLAS thread, best of 5,"
  echo "counted as d(d+1)/2 multiply-adds per row (the triangle syrk computes):"
  for d in "${widths[@]}"; do
    rows=$(( d > 500 ? 8000 : 200000 ))
    OPENBLAS_NUM_THREADS=1 /usr/bin/python3 - "$d" "$rows" <<'PY'
import sys, time
import numpy as np
d, n = int(sys.argv[1]), int(sys.argv[2])
z = np.random.default_rng(1).standard_normal((n, d))
best = min((lambda t0: (z.T @ z, time.perf_counter() - t0)[1])(time.perf_counter()) for _ in range(5))
print(f"  width {d:5d}, {n} rows: {n * d * (d + 1) / 2 / best / 1e9:6.2f} G multiply-adds/s")
PY
  done
fi
