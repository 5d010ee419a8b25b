#!/usr/bin/env python3
"""The benchmark harness behind bench/run (Python 3, standard library only).

Runs each benchmark --repeat times, takes medians, and writes a table with the
reference measured in the same run beside each figure, and the ratio, to
bench/results.md (and stdout). The load average is recorded with each section:
the machine is shared, so only ratios measured in the same run are compared.

Sections (--only NAME to run one):
  ingest   1,000,000-row load series through `ferrum ingest` vs the sqlite3
           shell's .import of the same file; peak memory (and 10,000,000 rows
           with --with-10m)
  fleet    5,000 units, 20 years of history, a year of hourly load:
           `ferrum assess --json` + `ferrum rank` vs a plain SELECT of the rows
  kernels  Google Benchmark: thermal kernel, unit reports on 1 and 2 threads
  latency  `ferrum serve`: lab file renamed into a party folder -> receipt ->
           updated unit report, 50 drops
"""
import argparse
import datetime
import json
import os
import re
import shutil
import statistics
import subprocess
import sys
import time
from pathlib import Path

AS_OF = "2026-12-01"
FLEET_UNITS = 5000
FLEET_CURVE = [1000, 5000, 20000]
INGEST_UNITS = 5000
LOAD_ORDERS = ["unit-major", "time-major", "shuffled"]
LATENCY_UNITS = 50
LATENCY_DROPS = 50

INI = """[site]
name = ferrum benchmark fleet
utc_offset = +00:00

[ingest]
settle_seconds = {settle}
rescan_seconds = 30

[schedule]
debounce_seconds = {debounce}

[log]
level = warn

[party.bench]
kinds = units_register, oil_lab, infrared, inspection, load_series
sites = *
"""


class Bench:
    def __init__(self, args):
        self.args = args
        self.build = Path(args.build).resolve()
        self.work = Path(args.work).resolve()
        self.ferrum = self.build / "daemon" / "ferrum"
        self.gen = self.build / "bench" / "ferrum_bench_gen"
        self.kernels = self.build / "bench" / "ferrum_bench_kernels"
        # Sizes: the targets' sizes, or tiny ones for --smoke (ctest label
        # smoke: the harness runs end to end in seconds, so it cannot rot).
        smoke = args.smoke
        self.ingest_units = 20 if smoke else INGEST_UNITS
        self.ingest_rows = 2000 if smoke else 1_000_000
        self.big_rows = 20_000 if smoke else 10_000_000
        self.fleet_sizes = [10, 20, 40] if smoke else FLEET_CURVE
        self.fleet_units = 20 if smoke else FLEET_UNITS
        self.latency_units = 5 if smoke else LATENCY_UNITS
        self.latency_drops = 3 if smoke else LATENCY_DROPS
        self.data = self.work / "data"
        self.data.mkdir(parents=True, exist_ok=True)
        self.rows = []      # result table rows
        self.notes = []     # lines printed under the table

    # ------------------------------------------------------------ helpers
    def log(self, msg):
        print(f"[bench {time.strftime('%H:%M:%S')}] {msg}", file=sys.stderr, flush=True)

    @staticmethod
    def loadavg():
        return "{:.2f} {:.2f} {:.2f}".format(*os.getloadavg())

    def run(self, cmd, **kw):
        return subprocess.run([str(c) for c in cmd], check=True, text=True, capture_output=True, **kw)

    def timed(self, cmd, stdout=subprocess.DEVNULL):
        """Runs cmd under /usr/bin/time -v: (wall seconds, peak RSS in MiB, stdout).
        The CPU seconds (user + system) of the last call are kept in self.cpu:
        on a shared machine they say more than the wall time."""
        t0 = time.perf_counter()
        p = subprocess.run(["/usr/bin/time", "-v"] + [str(c) for c in cmd], text=True,
                           stdout=stdout, stderr=subprocess.PIPE)
        wall = time.perf_counter() - t0
        if p.returncode != 0:
            raise RuntimeError(f"{cmd[0]} failed ({p.returncode}):\n{p.stderr[-2000:]}")
        rss = int(re.search(r"Maximum resident set size \(kbytes\): (\d+)", p.stderr).group(1)) / 1024
        self.cpu = sum(float(re.search(rf"{k} time \(seconds\): ([\d.]+)", p.stderr).group(1))
                       for k in ("User", "System"))
        return wall, rss, p.stdout

    def new_root(self, name, settle=1, debounce=0):
        root = self.work / name
        if root.exists():
            shutil.rmtree(root)
        root.mkdir(parents=True)
        (root / "ferrum.ini").write_text(INI.format(settle=settle, debounce=debounce))
        self.run([self.ferrum, "init", "--root", root])
        (root / "drop" / "bench").mkdir(parents=True, exist_ok=True)
        return root

    def drop(self, root, src, copy=True):
        dst = root / "drop" / "bench" / Path(src).name
        tmp = dst.with_name("." + dst.name + ".part")
        (shutil.copyfile if copy else os.link)(src, tmp)
        os.rename(tmp, dst)
        return dst

    def ingest(self, root, *files):
        """Untimed `ferrum ingest`; every file must be accepted."""
        p = self.run([self.ferrum, "ingest", "--root", root] + [str(f) for f in files])
        bad = [l for l in p.stdout.splitlines() if not l.startswith("accepted")]
        if bad:
            raise RuntimeError("setup file not accepted: " + "; ".join(bad))
        return p.stdout

    def generated(self, name, *args):
        """A generated file or folder under data/, made once (the generator is deterministic)."""
        path = self.data / name
        if not path.exists():
            self.log(f"generating {name}")
            tmp = path.with_name(path.name + ".building")
            if tmp.is_dir():
                shutil.rmtree(tmp)
            self.run([self.gen, *args, tmp])
            os.rename(tmp, path)
        return path

    def add(self, what, value, unit, reference="", ratio="", target="", met=""):
        self.rows.append((what, value, unit, reference, ratio, target, met))

    def section(self, name):
        self.log(f"{name}: load average {self.loadavg()}")
        self.notes.append(f"- {name}: load average at start {self.loadavg()}")

    # ------------------------------------------------------------ 1. ingest
    def bench_ingest(self):
        self.section("ingest")
        register = self.generated(f"units-{self.ingest_units}.csv", "register", self.ingest_units)
        one, big = self.ingest_rows, self.big_rows
        sizes = [one] + ([big] if self.args.with_10m or self.args.smoke else [])
        if self.args.only_10m:
            sizes = [big]
        results = {}
        # The same rows in three orders (bench/generate.cpp): the 1M file in
        # each, the 10M one time-major (the order that once thrashed SQLite's
        # page cache) for peak memory.
        runs = [(rows, order) for rows in sizes
                for order in (LOAD_ORDERS if rows == one else ["time-major"])]
        for rows, order in runs:
            data = self.generated(f"load-{rows}-{order}.csv", "load", rows, self.ingest_units, order)
            reps = self.args.repeat if rows == one else 1
            label = (f"{rows // 1_000_000}M" if rows >= 1_000_000 else f"{rows}-row") + f" {order}"
            f_wall, f_rss, s_wall, s_rss, f_cpu, s_cpu = [], [], [], [], [], []
            for i in range(reps):
                root = self.new_root(f"ingest-root-{label}")
                self.ingest(root, self.drop(root, register))
                dropped = self.drop(root, data)
                wall, rss, out = self.timed([self.ferrum, "ingest", "--root", root, dropped], stdout=subprocess.PIPE)
                if not out.startswith("accepted") or f"{rows} rows" not in out:
                    raise RuntimeError("ferrum ingest did not accept the file: " + out)
                f_wall.append(wall)
                f_rss.append(rss)
                f_cpu.append(self.cpu)
                db = self.work / "shell-import.db"
                db.unlink(missing_ok=True)
                wall, rss, _ = self.timed(["sqlite3", db, ".mode csv", f".import {data} load"])
                count = self.run(["sqlite3", db, "SELECT count(*) FROM load"]).stdout.strip()
                if int(count) != rows:
                    raise RuntimeError(f"sqlite3 .import gave {count} rows")
                s_wall.append(wall)
                s_rss.append(rss)
                s_cpu.append(self.cpu)
                self.log(f"ingest {rows} rows #{i + 1}: ferrum {f_wall[-1]:.2f} s {f_rss[-1]:.0f} MiB,"
                         f" sqlite3 shell {s_wall[-1]:.2f} s  (load {self.loadavg()})")
            fw, sw = statistics.median(f_wall), statistics.median(s_wall)
            results[(rows, order)] = statistics.median(f_rss)
            ratio = sw / fw
            self.add(f"ingest {label} load rows: `ferrum ingest` (n={reps})", f"{rows / fw / 1e3:.0f}k",
                     "rows/s", f"{rows / sw / 1e3:.0f}k (sqlite3 .import)", f"{ratio:.2f}×", "≥ 1.0×",
                     "yes" if ratio >= 1.0 else "no")
            self.add(f"ingest {label}: wall time ferrum / sqlite3 shell", f"{fw:.2f}", "s", f"{sw:.2f}", "", "", "")
            fc, sc = statistics.median(f_cpu), statistics.median(s_cpu)
            self.add(f"ingest {label}: CPU time (user + sys) ferrum / sqlite3 shell", f"{fc:.2f}", "s", f"{sc:.2f}",
                     f"{sc / fc:.2f}×", "≥ 1.0×", "yes" if sc >= fc else "no")
            self.add(f"ingest {label}: peak RSS ferrum / sqlite3 shell", f"{results[(rows, order)]:.0f}", "MiB",
                     f"{statistics.median(s_rss):.0f}", "", "", "")
        big, small = (big, "time-major"), (one, "time-major")
        if big in results and small in results:
            growth = results[big] / results[small]
            self.add(f"ingest peak RSS {big[0]:,} / {one:,} rows, time-major", f"{growth:.2f}", "×", "1M run", f"{growth:.2f}×",
                     "≤ 1.2×",
                     "yes" if growth <= 1.2 else "no")

    # ------------------------------------------------------------ 2. fleet
    def fleet_root(self, units):
        """A site of `units` units, ingested once and kept (its data is deterministic)."""
        files = self.generated(f"fleet-{units}", "fleet", units)
        root = self.work / f"fleet-root-{units}"
        if (root / ".complete").exists():
            return root
        self.log("ingesting the fleet (once; kept in the work folder)")
        root = self.new_root(f"fleet-root-{units}")
        t0 = time.perf_counter()
        self.ingest(root, self.drop(root, files / "units.csv"))
        others = ["oil.csv", "infrared.csv", "inspection.csv"] + sorted(
            p.name for p in files.glob("load-*.csv"))
        self.ingest(root, *[self.drop(root, files / name) for name in others])
        (root / ".complete").write_text(f"ingested in {time.perf_counter() - t0:.1f} s\n")
        return root

    def bench_fleet(self):
        """The fleet at the target size (fleet_units), then the cost curve."""
        root = self.fleet_root(self.fleet_units)
        self.section("fleet")
        db = root / "ferrum.db"
        counts = {}
        for table in ["units", "oil_samples", "oil_values", "infrared_scans", "inspections", "load_points"]:
            counts[table] = int(self.run(["sqlite3", "-readonly", db, f"SELECT count(*) FROM {table}"]).stdout)
        select_all = "; ".join(f"SELECT * FROM {t}" for t in counts)
        assess_t, rank_t, fresh_t, floor_t = [], [], [], []
        for i in range(self.args.repeat):
            wall, rss, _ = self.timed(["sqlite3", "-readonly", db, select_all])
            floor_t.append(wall)
            wall, a_rss, out = self.timed([self.ferrum, "assess", "--root", root, "--json", "--as-of", AS_OF],
                                          stdout=subprocess.PIPE)
            assess_t.append(wall)
            if len(json.loads(out)) != self.fleet_units:
                raise RuntimeError("assess --json did not list every unit")
            wall, r_rss, out = self.timed([self.ferrum, "rank", "--root", root, "--as-of", AS_OF])
            rank_t.append(wall)
            wall, f_rss, out = self.timed([self.ferrum, "rank", "--root", root, "--as-of", AS_OF, "--fresh"])
            fresh_t.append(wall)
            self.log(f"fleet #{i + 1}: assess {assess_t[-1]:.1f} s ({a_rss:.0f} MiB), rank {rank_t[-1]:.1f} s"
                     f" ({r_rss:.0f} MiB), rank --fresh {fresh_t[-1]:.1f} s ({f_rss:.0f} MiB),"
                     f" plain SELECT {floor_t[-1]:.1f} s  (load {self.loadavg()})")
        a, r, rf, f = (statistics.median(x) for x in (assess_t, rank_t, fresh_t, floor_t))
        n = counts["units"]
        self.add(f"fleet: `assess --json` + `rank`, {n} units (n={self.args.repeat})", f"{a + r:.1f}", "s",
                 f"{f:.1f} (2 × SELECT: {2 * f:.1f})", f"{(a + r) / (2 * f):.2f}× of 2 SELECTs", "≤ 60 s",
                 "yes" if a + r <= 60 else "no")
        self.add("fleet: `assess --json` per unit", f"{a / n * 1e3:.2f}", "ms", f"{f / n * 1e3:.2f} (SELECT)",
                 f"{a / f:.2f}×", "", "")
        self.add("fleet: `rank` per unit (inputs kept by `assess`)", f"{r / n * 1e3:.2f}", "ms",
                 f"{f / n * 1e3:.2f} (SELECT)", f"{r / f:.2f}×", "", "")
        self.add("fleet: `rank --fresh` (assesses every unit again)", f"{rf:.1f}", "s", f"{f:.1f} (SELECT)",
                 f"{rf / f:.2f}×", "", "")
        self.add("fleet: peak RSS `assess --json` / `rank --fresh`", f"{a_rss:.0f}", "MiB", f"{f_rss:.0f}", "", "", "")
        self.notes.append("- fleet rows: " + ", ".join(f"{t} {c:,}" for t, c in counts.items()))
        self.fleet_curve()
        self.weekly_bundle(root)

    def fleet_curve(self):
        """`assess --json` + `rank --fresh` per unit and peak memory at each fleet size: time per
        unit should stay flat within 20 %, peak memory should not grow with the fleet."""
        per_unit, peak = {}, {}
        for units in self.fleet_sizes:
            root = self.fleet_root(units)
            times, rss = [], []
            for _ in range(self.args.repeat):
                wall_a, rss_a, _ = self.timed([self.ferrum, "assess", "--root", root, "--json", "--as-of", AS_OF,
                                               "--quiet"], stdout=subprocess.DEVNULL)
                wall_r, rss_r, _ = self.timed([self.ferrum, "rank", "--root", root, "--as-of", AS_OF, "--fresh",
                                               "--quiet"])
                times.append((wall_a + wall_r) / units)
                rss.append(max(rss_a, rss_r))
            per_unit[units], peak[units] = statistics.median(times), statistics.median(rss)
            self.log(f"curve {units} units: {per_unit[units] * 1e3:.2f} ms/unit, {peak[units]:.0f} MiB"
                     f"  (load {self.loadavg()})")
        small, large = min(per_unit), max(per_unit)
        for units in sorted(per_unit):
            self.add(f"curve: `assess --json` + `rank --fresh`, {units:,} units", f"{per_unit[units] * 1e3:.2f}",
                     "ms/unit", f"{per_unit[small] * 1e3:.2f} ({small:,} units)",
                     f"{per_unit[units] / per_unit[small]:.2f}×", "≤ 1.2×",
                     "yes" if per_unit[units] <= 1.2 * per_unit[small] else "no")
        self.add(f"curve: peak RSS {large:,} / {small:,} units", f"{peak[large]:.0f}", "MiB", f"{peak[small]:.0f}",
                 f"{peak[large] / peak[small]:.2f}×", "≤ 1.2×", "yes" if peak[large] <= 1.2 * peak[small] else "no")
        # A small chart of the curve for results.md (text: the file is read in a terminal too).
        top = max(per_unit.values())
        for units in sorted(per_unit):
            bar = "#" * max(1, round(40 * per_unit[units] / top))
            self.notes.append(f"    {units:>6,} units {bar} {per_unit[units] * 1e3:.2f} ms/unit")

    def weekly_bundle(self, root):
        """The weekly bundle (every unit PDF, the fleet report, the index) of the target fleet."""
        shutil.rmtree(root / "reports", ignore_errors=True)
        wall, rss, _ = self.timed([self.ferrum, "report", "--root", root, "--weekly", "--as-of", AS_OF, "--quiet"])
        target = 180 * self.fleet_units / FLEET_UNITS
        self.add(f"weekly bundle, {self.fleet_units:,} units", f"{wall:.1f}", "s", f"CPU {self.cpu:.1f} s", "",
                 f"≤ {target:.0f} s", "yes" if wall <= target else "no")

    # ------------------------------------------------------------ 3+4. kernels
    def bench_kernels(self):
        self.section("kernels")
        out_json = self.work / "kernels.json"
        pdfs = self.work / "reports"
        shutil.rmtree(pdfs, ignore_errors=True)
        env = dict(os.environ, FERRUM_BENCH_OUT=str(pdfs))
        subprocess.run([str(self.kernels), f"--benchmark_repetitions={self.args.repeat}",
                        "--benchmark_report_aggregates_only=true", f"--benchmark_out={out_json}",
                        "--benchmark_out_format=json"], check=True, env=env, stdout=sys.stderr)
        # Google Benchmark writes aggregates (median, ...) only for two or more
        # repetitions; with --repeat 1 the single run is the median.
        med = {}
        rows = json.loads(out_json.read_text())["benchmarks"]
        for b in rows:
            if b.get("aggregate_name") == "median" or (self.args.repeat == 1 and b.get("run_type") == "iteration"):
                med[b.get("run_name", b["name"])] = b
        th = med["BM_ThermalUnitYear"]
        ms = th["real_time"]
        self.add(f"thermal kernel: 525,600 one-minute steps (n={self.args.repeat})", f"{ms:.1f}", "ms", "", "",
                 "≤ 20 ms", "yes" if ms <= 20 else "no")
        self.add("thermal kernel: per step", f"{ms * 1e6 / 525600:.1f}", "ns", "", "", "", "")
        cpu = th["cpu_time"]
        self.add("thermal kernel: CPU time (shared machine: the fairer figure)", f"{cpu:.1f}", "ms",
                 f"{cpu * 1e6 / 525600:.1f} ns/step", "", "≤ 20 ms", "yes" if cpu <= 20 else "no")
        one = med["BM_UnitReports/1/iterations:1/real_time"]["real_time"] / 200
        two = med["BM_UnitReports/2/iterations:1/real_time"]["real_time"] / 200
        cpu_one = med["BM_UnitReports/1/iterations:1/real_time"]["cpu_ms_per_unit"]
        pages = self.run(["qpdf", "--show-npages", next(pdfs.glob("*.pdf"))]).stdout.strip()
        self.add(f"unit report ({pages} pages), 1 thread (n={self.args.repeat})", f"{one:.1f}", "ms/unit", "", "",
                 "≤ 50 ms", "yes" if one <= 50 else "no")
        self.add("unit report, CPU time per report (1 thread)", f"{cpu_one:.1f}", "ms/unit", "", "", "≤ 50 ms",
                 "yes" if cpu_one <= 50 else "no")
        self.add("unit reports, 2 threads", f"{two:.1f}", "ms/unit", f"{one:.1f} (1 thread)",
                 f"{one / two:.2f}× speed-up", "≥ 1.7×", "yes" if one / two >= 1.7 else "no")

    # ------------------------------------------------------------ 5. latency
    def bench_latency(self):
        files = self.generated(f"fleet-{self.latency_units}", "fleet", self.latency_units)
        drops = self.generated(f"lab-drops-{self.latency_drops}", "lab", self.latency_drops, self.latency_units)
        root = self.new_root("latency-root", settle=0, debounce=0)
        self.ingest(root, self.drop(root, files / "units.csv"))
        self.ingest(root, *[self.drop(root, files / n) for n in
                            ["oil.csv", "infrared.csv", "inspection.csv", "load-01.csv"]])
        self.section("latency")
        log = open(root / "serve.out", "w")
        daemon = subprocess.Popen([str(self.ferrum), "serve", "--root", str(root)], stdout=log, stderr=log)
        try:
            self.wait(lambda: self.idle(root), 60, "the daemon to start")
            to_receipt, to_report = [], []
            for i, src in enumerate(sorted(drops.glob("lab-*.csv"))):
                unit = src.read_text().splitlines()[1].split(",")[0]
                tmp = root / "drop" / "bench" / ("." + src.name + ".part")
                shutil.copyfile(src, tmp)
                receipt = root / "drop" / "bench" / "receipts" / (src.name + ".json")
                t0 = time.time()
                os.rename(tmp, root / "drop" / "bench" / src.name)
                t_receipt = self.wait(lambda: receipt.exists(), 30, f"the receipt of {src.name}")
                t_report = self.wait(lambda: self.report_newer(root, unit, t0), 30, f"the report of {unit}")
                to_receipt.append(t_receipt - t0)
                to_report.append(t_report - t0)
                if '"accepted"' not in receipt.read_text():
                    raise RuntimeError(f"{src.name} was not accepted")
        finally:
            daemon.terminate()
            daemon.wait(timeout=30)
            log.close()

        def p95(v):
            return sorted(v)[max(0, int(round(0.95 * len(v))) - 1)]
        for what, v in (("receipt", to_receipt), ("updated unit report", to_report)):
            ok = p95(v) <= 1.0
            self.add(f"latency: rename → {what}, median (n={len(v)})", f"{statistics.median(v) * 1e3:.0f}", "ms",
                     "", "", "", "")
            self.add(f"latency: rename → {what}, p95", f"{p95(v) * 1e3:.0f}", "ms", "settle 0 s", "",
                     "≤ 1000 ms", "yes" if ok else "no")

    @staticmethod
    def idle(root):
        try:
            s = json.loads((root / "status.json").read_text())
            return s["files_waiting"] == 0 and s["units_waiting_for_report"] == 0
        except (OSError, ValueError, KeyError):
            return False

    @staticmethod
    def report_newer(root, unit, t0):
        for p in (root / "reports").glob(f"ferrum-{unit}-*.pdf"):
            if p.stat().st_mtime >= t0:
                return True
        return False

    @staticmethod
    def wait(predicate, timeout, what):
        end = time.time() + timeout
        while time.time() < end:
            if predicate():
                return time.time()
            time.sleep(0.002)
        raise RuntimeError(f"timed out waiting for {what}")

    # ------------------------------------------------------------ output
    def table(self):
        head = ["benchmark", "median", "unit", "reference (same run)", "ratio", "target", "met"]
        lines = ["| " + " | ".join(head) + " |", "|" + "---|" * len(head)]
        lines += ["| " + " | ".join(str(c) for c in r) + " |" for r in self.rows]
        return "\n".join(lines)

    def write(self, started):
        commit = self.run(["git", "-C", Path(__file__).resolve().parent.parent, "rev-parse", "--short", "HEAD"]).stdout.strip()
        cpu = next((l.split(":", 1)[1].strip() for l in open("/proc/cpuinfo") if l.startswith("model name")), "?")
        text = [f"Run {started} UTC, commit {commit}, {os.cpu_count()} × {cpu}, "
                f"repeat {self.args.repeat}, Release build.", "", self.table(), ""] + self.notes + \
               [f"- load average at end {self.loadavg()}", ""]
        print("\n".join(text))
        if self.args.results and not self.args.only:  # a partial run does not replace the table
            self.merge_results(Path(self.args.results), "\n".join(text))

    @staticmethod
    def merge_results(path, text):
        """Replaces the part of results.md between the markers, keeping the prose around it."""
        begin, end = "<!-- bench/run: table begins -->", "<!-- bench/run: table ends -->"
        old = path.read_text() if path.exists() else f"# Benchmark results\n\n{begin}\n{end}\n"
        if begin not in old:
            old += f"\n{begin}\n{end}\n"
        head, rest = old.split(begin, 1)
        tail = rest.split(end, 1)[1] if end in rest else ""
        path.write_text(f"{head}{begin}\n{text}\n{end}{tail}")


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--build", required=True, help="Release build folder")
    ap.add_argument("--work", required=True, help="scratch folder for data and site roots")
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--with-10m", action="store_true", help="also ingest a 10,000,000-row file (peak memory)")
    ap.add_argument("--only-10m", action="store_true", help="ingest only the 10,000,000-row file")
    ap.add_argument("--only", action="append", choices=["ingest", "fleet", "kernels", "latency"])
    ap.add_argument("--results", help="results.md to update (only by a run of every section)")
    ap.add_argument("--smoke", action="store_true",
                    help="tiny sizes, repeat 1, no results written: checks that the harness runs (ctest label smoke)")
    args = ap.parse_args()
    if args.smoke:
        args.repeat, args.results = 1, None
    b = Bench(args)
    started = datetime.datetime.now(datetime.timezone.utc).strftime("%Y-%m-%d %H:%M")
    sections = args.only or ["ingest", "fleet", "kernels", "latency"]
    if args.smoke and not b.kernels.exists():
        sections = [s for s in sections if s != "kernels"]  # Google Benchmark kernels: bench/run only
    for name in sections:
        getattr(b, "bench_" + name)()
    b.write(started)


if __name__ == "__main__":
    main()
