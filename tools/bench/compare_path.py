#!/usr/bin/python3
"""Side-by-side speed of Lariat's path refit and moments update against general-purpose libraries.

Path: for each shape (features p, rows n = 2p, steps 50, 200 or the whole path) this times, interleaved
in one run, `lariat.jar bench path ... --json` and scikit-learn's `sklearn.linear_model.lars_path_gram`
(method='lasso', alpha_min=0, max_iter = steps, or 10 * p for the whole path) on a problem of the same
kind: Gaussian rows, 10% true nonzeros, y = X beta + noise, seeded. For the library the columns are
centered and scaled to unit norm and y is centered (the scale Lariat's engine uses), and Xy and the Gram
matrix are precomputed and not timed; its default copy_Gram=True copy of the Gram is inside the timing
(the function permutes the Gram in place otherwise). Both sides take the median of the same number of
timed runs after warm-up (the jar warms up for 1 s, at least one untimed fit; the library gets
one untimed call).

Moments: `lariat.jar bench moments` (records through MomentStream, block size and threads as printed; the
jar's default thread count is the available processors) against numpy's
X.T @ X on the same number of rows of width p + 1 (numpy dispatches this to the BLAS syrk/gemm of
whatever library it is linked with; the script prints which).

Ratios are library_s / ours_s (above 1: Lariat is faster). Run with Debian's /usr/bin/python3 (python3-
sklearn 1.2.1, numpy 1.24). Usage: tools/bench/compare_path.py [--jar processor/target/lariat.jar]
[--quick] [--repeat R] [--only path|moments].
"""

import argparse
import json
import os
import platform
import statistics
import subprocess
import sys
import tempfile
import time
import warnings

import numpy as np
import sklearn
from sklearn.linear_model import lars_path_gram

FEATURES = [100, 200, 500, 1000, 2000]
STEPS = [50, 200, 0]  # 0 = the whole path
MOMENT_SHAPES = [(100, 200_000), (1000, 8_000)]
TARGET_STEPS = 3.0
TARGET_FULL = 10.0


def machine():
    model = "unknown"
    try:
        with open("/proc/cpuinfo") as f:
            for line in f:
                if line.startswith("model name"):
                    model = line.split(":", 1)[1].strip()
                    break
    except OSError:
        pass
    return {"nproc": os.cpu_count(), "cpu": model, "python": platform.python_version(),
            "numpy": np.__version__, "sklearn": sklearn.__version__}


def blas_in_use():
    """Which BLAS numpy actually loaded (threadpoolctl), else numpy's build configuration."""
    try:
        from threadpoolctl import threadpool_info
        libs = [f"{i.get('internal_api')} {i.get('version')} ({i.get('threading_layer', '?')}, "
                f"{i.get('num_threads')} threads)" for i in threadpool_info() if i.get("user_api") == "blas"]
        if libs:
            return "; ".join(libs)
    except ImportError:
        pass
    return "see numpy.show_config()"


def problem(p, n, seed):
    """Gaussian rows, ceil(p/10) true nonzeros, unit-variance noise; standardized as the engine does."""
    rng = np.random.default_rng(seed)
    x = rng.standard_normal((n, p))
    beta = np.zeros(p)
    nz = rng.choice(p, size=(p + 9) // 10, replace=False)
    beta[nz] = rng.standard_normal(nz.size)
    y = x @ beta + rng.standard_normal(n)
    return x, y


def standardized_gram(x, y):
    xc = x - x.mean(axis=0)
    xc /= np.sqrt((xc * xc).sum(axis=0))
    yc = y - y.mean()
    return xc.T @ xc, xc.T @ yc


def time_library(p, n, steps, repeat, seed):
    x, y = problem(p, n, seed)
    gram, xy = standardized_gram(x, y)
    max_iter = steps if steps > 0 else 10 * p

    def once():
        return lars_path_gram(xy, gram, n_samples=n, max_iter=max_iter, alpha_min=0, method="lasso",
                              return_n_iter=True)

    once()
    seconds = []
    cpu = []
    n_iter = None
    for _ in range(repeat):
        c0 = time.thread_time()
        t0 = time.perf_counter()
        _, _, _, n_iter = once()
        seconds.append(time.perf_counter() - t0)
        cpu.append(time.thread_time() - c0)
    return {"median_s": statistics.median(seconds), "min_s": min(seconds), "max_s": max(seconds),
            "cpu_median_s": statistics.median(cpu), "steps": int(n_iter)}


def run_jar(jar, args):
    with tempfile.NamedTemporaryFile(suffix=".json", delete=False) as f:
        out = f.name
    try:
        subprocess.run(["java", "-jar", jar] + args + ["--json", out], check=True, stdout=subprocess.DEVNULL)
        with open(out) as f:
            return json.load(f)
    finally:
        os.unlink(out)


def time_ours(jar, p, n, steps, repeat, seed, prototype=False):
    # Every shape warms up for 1 s (at least one untimed fit), as the library gets one untimed call: a
    # whole path at p = 1000 now takes about 0.1 s, shorter than the JIT needs to compile its kernels.
    warmup = "1.0"
    return run_jar(jar, ["bench", "path", "--features", str(p), "--rows", str(n), "--steps", str(steps),
                         "--repeat", str(repeat), "--seed", str(seed), "--warmup-s", warmup]
                   + (["--prototype"] if prototype else []))


def time_xtx(p, n, repeat, seed):
    rng = np.random.default_rng(seed)
    z = rng.standard_normal((n, p + 1))
    _ = z.T @ z
    seconds = []
    cpu = []
    for _ in range(repeat):
        c0 = time.process_time()
        t0 = time.perf_counter()
        _ = z.T @ z
        seconds.append(time.perf_counter() - t0)
        cpu.append(time.process_time() - c0)
    return n / statistics.median(seconds), n / statistics.median(cpu)


def path_rows(args):
    rows = []
    i = 0
    for p in args.features:
        for steps in STEPS:
            n = 2 * p
            repeat = args.repeat if not (steps == 0 and p >= 1000) else args.repeat_full_large
            first_ours = i % 2 == 0
            i += 1
            if first_ours:
                ours = time_ours(args.jar, p, n, steps, repeat, args.seed)
                lib = time_library(p, n, steps, repeat, args.seed)
            else:
                lib = time_library(p, n, steps, repeat, args.seed)
                ours = time_ours(args.jar, p, n, steps, repeat, args.seed)
            proto = time_ours(args.jar, p, n, steps, repeat, args.seed, True) if args.prototype else None
            ratio = lib["median_s"] / ours["median_s"]
            cpu_ratio = lib["cpu_median_s"] / ours["cpu_median_s"]
            proto_ratio = lib["median_s"] / proto["median_s"] if proto else float("nan")
            target = TARGET_FULL if steps == 0 else TARGET_STEPS
            applies = steps != 0 or p >= 1000
            verdict = ("ok" if ratio >= target else "MISS") if applies else "-"
            rows.append((p, n, "full" if steps == 0 else str(steps), ours["steps"], lib["steps"], repeat,
                         ours["median_s"], lib["median_s"], ratio, cpu_ratio, f">={target:g}x" if applies else "",
                         verdict, proto["median_s"] if proto else float("nan"), proto_ratio))
            print(f"  path p={p} steps={'full' if steps == 0 else steps}: ours {ours['median_s']:.4f} s, "
                  f"library {lib['median_s']:.4f} s" + (f", prototype {proto['median_s']:.4f} s" if proto else ""),
                  file=sys.stderr, flush=True)
    return rows


def moment_rows(args):
    rows = []
    for i, (p, n) in enumerate(MOMENT_SHAPES):
        if args.quick:
            n = max(n // 10, 2000)
        run_ours = lambda: run_jar(args.jar, ["bench", "moments", "--features", str(p), "--rows", str(n),
                                              "--seed", str(args.seed)])
        if i % 2 == 0:
            ours = run_ours()
            lib, lib_cpu = time_xtx(p, n, 3, args.seed)
        else:
            lib, lib_cpu = time_xtx(p, n, 3, args.seed)
            ours = run_ours()
        ratio = ours["records_per_s"] / lib
        cpu_ratio = ours["records_per_cpu_s"] / lib_cpu
        target = 1.0 if p <= 100 else 0.5
        rows.append((p, n, ours["block_size"], ours["records_per_s"], lib, ratio, cpu_ratio, f">={target:g}",
                     "ok" if ratio >= target else "MISS", ours.get("threads", 1)))
        print(f"  moments p={p}: ours {ours['records_per_s']:.0f}/s, X'X {lib:.0f}/s", file=sys.stderr, flush=True)
    return rows


def main():
    ap = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    ap.add_argument("--jar", default="processor/target/lariat.jar")
    ap.add_argument("--repeat", type=int, default=5, help="timed runs per shape, both sides (default 5)")
    ap.add_argument("--repeat-full-large", type=int, default=3,
                    help="timed runs for the whole path at p >= 1000, both sides (default 3)")
    ap.add_argument("--seed", type=int, default=1)
    ap.add_argument("--features", type=int, nargs="*", default=FEATURES)
    ap.add_argument("--quick", action="store_true", help="fewer rows for the moments shapes")
    ap.add_argument("--only", choices=["path", "moments"], help="run just this section (default: both)")
    ap.add_argument("--prototype", action="store_true",
                    help="also time the benchmark package's prototype kernel (bench path --prototype)")
    args = ap.parse_args()
    warnings.filterwarnings("ignore", module="sklearn")

    start = time.time()
    load_start = os.getloadavg()
    info = machine()
    print(f"machine: nproc={info['nproc']}, cpu={info['cpu']}; python {info['python']}, numpy {info['numpy']}, "
          f"scikit-learn {info['sklearn']}")
    print(f"numpy BLAS: {blas_in_use()}")
    print(f"load average at start: {load_start[0]:.2f} {load_start[1]:.2f} {load_start[2]:.2f}", flush=True)

    prows = path_rows(args) if args.only != "moments" else []
    mrows = moment_rows(args) if args.only != "path" else []

    if args.only != "moments":
        print()
        print("Path refit from a prebuilt Gram (rows n = 2p), median seconds; ratio = library_s / ours_s")
        print(f"{'p':>5} {'n':>5} {'steps':>5} {'ours_k':>6} {'lib_k':>6} {'rep':>3} {'ours_s':>10} "
              f"{'sklearn_s':>10} {'ratio':>7} {'cpu_rat':>7} {'target':>7} {'':>4}"
              + (f" {'proto_s':>9} {'proto_rat':>9}" if args.prototype else ""))
        for r in prows:
            print(f"{r[0]:>5} {r[1]:>5} {r[2]:>5} {r[3]:>6} {r[4]:>6} {r[5]:>3} {r[6]:>10.5f} {r[7]:>10.5f} "
                  f"{r[8]:>7.2f} {r[9]:>7.2f} {r[10]:>7} {r[11]:>4}"
                  + (f" {r[12]:>9.5f} {r[13]:>9.2f}" if args.prototype else ""))
    if args.only != "path":
        print()
        print("Moments update, records per second; ratio = ours / numpy X.T @ X")
        print(f"{'p':>5} {'rows':>7} {'block':>5} {'thr':>3} {'ours_rec/s':>12} {'numpy_rec/s':>12} {'ratio':>7} "
              f"{'cpu_rat':>7} {'target':>7} {'':>4}")
        for r in mrows:
            print(f"{r[0]:>5} {r[1]:>7} {r[2]:>5} {r[9]:>3} {r[3]:>12.0f} {r[4]:>12.0f} {r[5]:>7.3f} {r[6]:>7.3f} "
                  f"{r[7]:>7} {r[8]:>4}")
    load_end = os.getloadavg()
    print()
    print(f"load average at end: {load_end[0]:.2f} {load_end[1]:.2f} {load_end[2]:.2f}; "
          f"wall time {time.time() - start:.0f} s")
    print("ours_k / lib_k: steps each path actually took; ratio: of median wall times; cpu_rat: of median CPU times "
          "(ours: the benchmark thread for the path, all Java threads for the moments; path library: its calling thread, so BLAS helper threads that spin or work are not counted; numpy X'X: the whole process, BLAS threads included)"
          + ("; proto_*: the prototype kernel (--prototype), ratio library_s / proto_s." if args.prototype else "."))


if __name__ == "__main__":
    main()
