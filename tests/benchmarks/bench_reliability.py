"""Reliability battery: traywise used as a careful user would, through the command line.

    python tests/benchmarks/bench_reliability.py [--valid N] [--mutations N] [--kills N] [--seed S]

1. Valid cases: a fixed-seed generator varies the demo cases across the whole case format (flows,
   temperatures, pressures, stages, adiabatic and isothermal columns, coolers, heat loss, side feeds
   and draws, Murphree and overall efficiencies, designs of every kind with minimum solvent and
   O'Connell, sweeps, activity models UNIFAC and NRTL, equilibrium tables, the Peng-Robinson gas and
   liquid, inline components, internals (trays and packing), the report table) within the ranges
   cases/README.md states; each runs as `traywise run` (or `traywise sweep`) in a subprocess.
   Counted: converged (exit 0, or 4 for a design that is marked NOT MET; results written and
   balances closed), honest non-convergence (exit 3, one error line, nothing written), refused
   although valid (exit 2: must be 0), tracebacks or other failures (must be 0), and any stderr line
   that is not traywise's own (an untranslated library warning: must be 0).
2. Malformed mutations of the demo cases (a value of the wrong kind or unit, out of range, empty,
   a key misspelt or removed, a table broken): counted as refused with the file and the key named,
   refused otherwise, accepted (the mutation is still a valid case), tracebacks.
3. Kills and concurrency: `traywise run` and `traywise sweep --processes 2` killed by SIGTERM and
   SIGKILL at random moments (no process may survive, nothing half-written may stay visible, the
   next run into the same folder must succeed and remove the temporaries), and three runs at once
   into one folder (each ends cleanly; the folder is a complete results folder afterwards).

The counts are printed as tables; the exit status is 1 when a must-be-zero count is not zero.
``tests/test_reliability_sample.py`` runs a bounded sample of it.
"""

import argparse
import json
import os
import random
import re
import signal
import subprocess
import sys
import tempfile
import time
import tomllib
from pathlib import Path

sys.path.insert(0, str(Path(__file__).parents[1]))  # the tests folder, for its support package
from support.processes import alive, children  # noqa: E402

ROOT = Path(__file__).resolve().parents[2]
CASES = ROOT / "cases"
DEMOS = sorted(p.name for p in CASES.glob("*.toml"))
HONEST = ("no converged solution", "physically impossible", "design target not reached")
TIMEOUT = 300  # s per run: a run this slow counts as a failure


# -- a small TOML writer (the cases hold tables, arrays of tables, strings, numbers, lists) -----
def _key(name):
    return name if re.fullmatch(r"[A-Za-z0-9_-]+", name) else json.dumps(name)


def _value(value):
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, (int, float)):
        return repr(value)
    if isinstance(value, str):
        return json.dumps(value)
    if isinstance(value, list):
        return "[" + ", ".join(_value(v) for v in value) + "]"
    if isinstance(value, dict):
        return "{ " + ", ".join(f"{_key(k)} = {_value(v)}" for k, v in value.items()) + " }"
    raise TypeError(value)


def _is_table_array(value):
    return isinstance(value, list) and value and all(isinstance(v, dict) for v in value)


def to_toml(data, prefix=()):
    """TOML text of ``data``: plain keys first, then sub-tables and arrays of tables."""
    lines = []
    plain = {k: v for k, v in data.items() if not isinstance(v, dict) and not _is_table_array(v)}
    for k, v in plain.items():
        lines.append(f"{_key(k)} = {_value(v)}")
    for k, v in data.items():
        path = (*prefix, _key(k))
        if isinstance(v, dict):
            lines.append(f"\n[{'.'.join(path)}]")
            lines.append(to_toml(v, path))
        elif _is_table_array(v):
            for item in v:
                lines.append(f"\n[[{'.'.join(path)}]]")
                lines.append(to_toml(item, path))
    return "\n".join(line for line in lines if line != "")


# -- valid cases --------------------------------------------------------------------------------
def _scaled(text, factor):
    number, unit = text.split(" ", 1)
    return f"{float(number) * factor:.6g} {unit}"


def _water_based(case):
    return case.get("solvent", "water") == "water" and "water" in case["components"]


def valid_case(rng):
    """(command, case dict, what it exercises) of one generated valid case."""
    name = rng.choice(DEMOS)
    case = tomllib.loads((CASES / name).read_text(encoding="utf-8"))
    features = [name.removesuffix(".toml")]
    column = case["column"]
    command = "run"
    case.pop("sweep", None) if rng.random() < 0.7 else None
    # flows and temperatures within the demo's own neighbourhood (the ranges of cases/README.md)
    case["gas_feed"]["flow"] = _scaled(case["gas_feed"]["flow"], rng.uniform(0.3, 3.0))
    if "flow" in case["solvent_feed"]:
        case["solvent_feed"]["flow"] = _scaled(case["solvent_feed"]["flow"], rng.uniform(0.3, 3.0))
    if _water_based(case):
        case["solvent_feed"]["temperature"] = f"{rng.uniform(5, 45):.1f} degC"
        case["gas_feed"]["temperature"] = f"{rng.uniform(5, 80):.1f} degC"
    n = max(1, int(column["stages"] * rng.uniform(0.3, 3.0)))
    column["stages"] = n
    column["top_pressure"] = _scaled(column["top_pressure"], rng.uniform(0.9, 1.5))
    column.pop("cooler", None)
    design = "design" in case
    if design and rng.random() < 0.4:
        case.pop("design")
        design = False
    if not design and rng.random() < 0.25 and "internals" not in case:
        case["design"] = _design(rng, case, n)
        design = True
        features.append(f"design:{case['design']['solve_for']}")
    asked = case.get("design", {})
    bound_ok = not (asked.get("solve_for") == "stages" or asked.get("oconnell_efficiency"))  # README, [design]
    if not bound_ok:
        pass  # nothing stage-bound may be added
    elif rng.random() < 0.3 and "design" not in case:
        column["mode"] = "isothermal"
        if _water_based(case):
            column["isothermal_temperature"] = (f"{rng.uniform(10, 45):.1f} degC" if rng.random() < 0.7 else
                                                [f"{rng.uniform(10, 45):.1f} degC" for _ in range(n)])
        else:
            column["isothermal_temperature"] = case["solvent_feed"]["temperature"]
        features.append("isothermal")
    else:
        if rng.random() < 0.4 and "cooler_stage" not in case.get("design", {}):
            column["cooler"] = [{"stage": rng.randint(1, n), "duty": f"{rng.uniform(1, 40):.1f} kW"}]
            features.append("cooler")
        if rng.random() < 0.2:
            column["heat_loss"] = f"{rng.uniform(0.1, 5):.2f} kW"
            features.append("heat loss")
    if bound_ok:
        if rng.random() < 0.25:
            column.pop("overall_efficiency", None)
            column["murphree_efficiency"] = (round(rng.uniform(0.4, 1.0), 3) if rng.random() < 0.5 or case.get(
                "design", {}).get("minimum_solvent") else [round(rng.uniform(0.4, 1.0), 3) for _ in range(n)])
            features.append("murphree")
        elif rng.random() < 0.4:
            column["overall_efficiency"] = round(rng.uniform(0.3, 1.0), 3)
        if rng.random() < 0.15 and n >= 3 and "design" not in case:
            column["side_draw"] = [{"stage": rng.randint(2, n - 1), "phase": rng.choice(["liquid", "vapour"]),
                                    "fraction": round(rng.uniform(0.05, 0.5), 3)}]
            features.append("side draw")
        if rng.random() < 0.15 and n >= 3 and "design" not in case:
            feed = {k: v for k, v in case["solvent_feed"].items()}
            feed["flow"] = _scaled(case["solvent_feed"].get("flow", "100 kg/h"), 0.2) if "flow" in feed else "20 kg/h"
            feed.setdefault("composition", {case.get("solvent", "water"): 1.0})
            column["side_feed"] = [{"stage": rng.randint(2, n), "phase": "liquid", **feed}]
            features.append("side feed")
    if rng.random() < 0.2 and _water_based(case) and "internals" not in case and "design" not in case:
        case["internals"] = rng.choice([{"tray_type": "sieve"}, {"tray_type": "valve", "tray_spacing": "chosen"},
                                        {"packing": "ceramic raschig rings 25 mm"}])
        features.append("internals")
    if rng.random() < 0.15 and name == "solvent-recovery-dryer-air.toml":
        case["liquid_model"] = {"activity": "unifac", "version": "original"}
        features.append("UNIFAC original")
    elif rng.random() < 0.2 and name == "solvent-recovery-dryer-air.toml":
        case["components"] = ["water", "acetone", "nitrogen", "oxygen"]
        comp = case["gas_feed"]["composition"]
        comp.pop("methanol", None)
        case["component"].pop("methanol", None)
        case["liquid_model"] = {"activity": "nrtl", "members": ["water", "acetone"], "source": "invented for a test",
                                "alpha": 0.3, "b": {"water": {"acetone": f"{rng.uniform(200, 700):.0f} K"},
                                                    "acetone": {"water": f"{rng.uniform(-100, 300):.0f} K"}}}
        features.append("NRTL")
    if rng.random() < 0.1 and _water_based(case) and "gas_model" not in case:  # a real gas needs library components
        case["components"].append("demo gas")
        case.setdefault("component", {})["demo gas"] = {
            "molar_mass": "44 g/mol", "equilibrium": "henry", "henry_constant": f"{rng.uniform(1e6, 1e8):.3g} Pa",
            "enthalpy_of_solution": f"{-rng.uniform(5, 30):.1f} kJ/mol", "gas_heat_capacity": "37 J/(mol K)"}
        case["gas_feed"]["composition"]["demo gas"] = "0.5 mol%"
        features.append("inline component")
    if "packing" in case.get("internals", {}):  # a packed column has no trays (case/internals.py)
        for key in ("overall_efficiency", "murphree_efficiency"):
            column.pop(key, None)
        if "murphree" in features:
            features.remove("murphree")
    if rng.random() < 0.1:
        case["report"] = {"plots": rng.random() < 0.5}
    if "sweep" in case and "design" not in case:
        command = "sweep"
        features.append("sweep")
    elif "sweep" in case:
        case.pop("sweep")
    return command, case, features


def _design(rng, case, n):
    solve_for = rng.choice(["solvent_flow", "solvent_flow", "stages", "cooler_duty"])
    design = {"solve_for": solve_for}
    key_fraction = _key_fraction(case)
    if solve_for == "cooler_duty":
        if case["column"].get("mode") == "isothermal" or not _water_based(case):
            return {"solve_for": "solvent_flow", "fraction_absorbed": round(rng.uniform(0.5, 0.95), 3)}
        design["cooler_stage"] = rng.randint(1, n)
        design["column_temperature_limit"] = f"{rng.uniform(30, 60):.0f} degC"
        return design
    if rng.random() < 0.5 or key_fraction is None:
        design["fraction_absorbed"] = round(rng.uniform(0.5, 0.99), 3)
    else:
        design["outlet_mole_fraction"] = f"{key_fraction * rng.uniform(0.005, 0.3) * 1e6:.4g} ppmv"
    if rng.random() < 0.3:
        design["minimum_solvent"] = True
    if rng.random() < 0.3 and _water_based(case):
        design["oconnell_efficiency"] = True
    return design


def _key_fraction(case):
    key = case.get("key_component")
    text = case["gas_feed"].get("composition", {}).get(key) if key else None
    if isinstance(text, str) and text.endswith("mol%"):
        return float(text.split()[0]) / 100.0
    return None


# -- running ------------------------------------------------------------------------------------
def traywise(*args, cwd, timeout=TIMEOUT):
    env = {**os.environ, "PYTHONWARNINGS": "default"}
    return subprocess.run([sys.executable, "-m", "traywise.cli", *args], cwd=cwd, capture_output=True, text=True,
                          timeout=timeout, env=env)


def foreign_lines(stderr):
    """stderr lines that are not traywise's own messages (an untranslated warning, a traceback)."""
    return [line for line in stderr.splitlines() if line.strip() and not line.startswith("traywise: ")]


def _balanced(record):
    """Component balances of a results.json record, recomputed from its four streams (columns
    without side feeds or draws): largest relative imbalance [-]."""
    streams = [record[s]["component_flows_mol_per_s"] for s in ("gas_in", "solvent_in", "gas_out", "liquid_out")]
    worst = 0.0
    for name in streams[0]:
        fed = streams[0][name] + streams[1][name]
        left = streams[2][name] + streams[3][name]
        worst = max(worst, abs(fed - left) / max(fed, 1e-300))
    return worst


def classify_valid(command, case, folder):
    """One of 'converged', 'honest', 'refused', 'failure' and the reason."""
    path = folder / "case.toml"
    path.write_text(to_toml(case), encoding="utf-8")
    out = folder / "out"
    args = [command, str(path), "--out", str(out), "-q"] + (["--no-plots"] if command == "run" else [])
    try:
        done = traywise(*args, cwd=folder)
    except subprocess.TimeoutExpired:
        return "failure", f"no answer within {TIMEOUT} s"
    foreign = foreign_lines(done.stderr)
    if "Traceback" in done.stderr or done.returncode not in (0, 2, 3, 4):
        return "failure", f"exit {done.returncode}: {done.stderr.strip()[-400:]}"
    if foreign:
        return "failure", f"foreign stderr: {foreign[:3]}"
    if done.returncode == 2:
        return "refused", done.stderr.strip()
    if done.returncode == 3:
        errors = [line for line in done.stderr.splitlines() if line.startswith("traywise: error:")]
        if len(errors) != 1 or not any(word in errors[0] for word in HONEST) or out.exists():
            return "failure", f"dishonest exit 3: {done.stderr.strip()[-300:]}"
        return "honest", errors[0]
    if command == "sweep":
        table = json.loads((out / "sweep.json").read_text())
        return "converged", f"{table.get('points', '?')} points"
    record = json.loads((out / "results.json").read_text())
    if "side_feed" not in case["column"] and "side_draw" not in case["column"]:
        worst = _balanced(record)
        if not worst < 1e-6:
            return "failure", f"component balance off by {worst:.3g} in a result given as good"
    if done.returncode == 4 and "NOT MET" not in (out / "report.md").read_text() and "BROKEN" not in (
            out / "report.md").read_text():
        return "failure", "exit 4 without NOT MET or BROKEN in the report"
    return "converged", "design not met, marked" if done.returncode == 4 else ""


# -- malformed mutations ------------------------------------------------------------------------
MUTATIONS = (
    ("a number for a text with unit", lambda v: "42"),
    ("a temperature unit", lambda v: '"40 degC"' if "degC" not in v else '"40 kg/h"'),
    ("negative", lambda v: re.sub(r'"([0-9.]+)', r'"-\1', v, count=1) if v.startswith('"') else f"-{v}"),
    ("huge", lambda v: re.sub(r"[0-9.]+(e[0-9]+)?", "1e308", v, count=1)),
    ("tiny", lambda v: re.sub(r"[0-9.]+(e[0-9]+)?", "1e-308", v, count=1)),
    ("empty text", lambda v: '""'),
    ("a word", lambda v: '"plenty"'),
    ("a list", lambda v: "[1, 2]"),
    ("a table", lambda v: "{ a = 1 }"),
    ("a boolean", lambda v: "true"),
    ("a 400-digit integer", lambda v: "9" * 400),
    ("not a number", lambda v: '"nan kg/h"'),
)


def mutations(rng, count):
    """(demo name, mutated text, key mutated, what was done) for ``count`` mutations."""
    found = []
    for name in DEMOS:
        lines = (CASES / name).read_text(encoding="utf-8").splitlines()
        inside, candidates = False, []
        for i, line in enumerate(lines):
            if line.count('"""') % 2:
                inside = not inside
                continue
            match = None if inside else re.match(r'^(\s*)([A-Za-z_][\w-]*)\s*=\s*(.+?)\s*(#.*)?$', line)
            if match and not match.group(3).endswith('"""'):
                candidates.append((i, match))
        found.append((name, lines, candidates))
    result = []
    while len(result) < count:
        name, lines, candidates = rng.choice(found)
        i, match = rng.choice(candidates)
        indent, key, value = match.group(1), match.group(2), match.group(3)
        kind = rng.random()
        new = list(lines)
        if kind < 0.1:
            what = "key misspelt"
            new[i] = f"{indent}{key}x = {value}"
        elif kind < 0.18:
            what = "key removed"
            del new[i]
        else:
            what, change = rng.choice(MUTATIONS)
            new[i] = f"{indent}{key} = {change(value)}"
        result.append((name, "\n".join(new) + "\n", key, what))
    return result


def classify_mutation(text, key, folder):
    path = folder / "mutated.toml"
    path.write_text(text, encoding="utf-8")
    try:
        done = traywise("run", str(path), "--out", str(folder / "out"), "-q", "--no-plots", cwd=folder)
    except subprocess.TimeoutExpired:
        return "failure", "no answer"
    if "Traceback" in done.stderr or done.returncode == 1 or foreign_lines(done.stderr):
        return "failure", done.stderr.strip()[-300:]
    if done.returncode == 2:
        line = done.stderr.strip()
        named = "mutated.toml" in line and (key in line or "line " in line)
        return ("named" if named else "refused"), line
    return "accepted", f"exit {done.returncode}"


# -- kills and concurrency ----------------------------------------------------------------------
def kill_check(rng, folder, *, sweep, sig):
    """Kill a run (or a two-process sweep) at a random moment; then check: no process left,
    no partly written folder visible, and the next run into the same folder succeeds and leaves
    no temporaries. Returns (ok, reason, whether the signal landed before the process ended)."""
    case = CASES / ("ammonia-scrubber-design.toml" if sweep else "ammonia-recovery.toml")
    out = folder / "out"
    args = (["sweep", str(case), "--processes", "2", "--points", "40"] if sweep else ["run", str(case)])
    args += ["--out", str(out), "-q"]
    process = subprocess.Popen([sys.executable, "-m", "traywise.cli", *args], cwd=folder, stdout=subprocess.PIPE,
                               stderr=subprocess.PIPE, text=True)
    workers = []
    deadline = time.monotonic() + (rng.uniform(0.5, 4.0) if sweep else rng.uniform(0.2, 1.5))
    while time.monotonic() < deadline and process.poll() is None:
        time.sleep(0.05)
        workers = children(process.pid) or workers
    landed = process.poll() is None
    if landed:
        process.send_signal(sig)
    try:
        process.communicate(timeout=20)  # the pipes close: no worker holds them
    except subprocess.TimeoutExpired:
        process.kill()
        process.communicate()
        return False, "the pipes stayed open 20 s after the signal", landed
    limit = time.monotonic() + 10
    while any(alive(w) for w in workers) and time.monotonic() < limit:
        time.sleep(0.1)
    if any(alive(w) for w in workers):
        for w in workers:
            if alive(w):
                os.kill(w, signal.SIGKILL)
        return False, "a worker outlived its parent", landed
    if out.exists() and not (out / ".traywise-results").exists():
        return False, "a partly written results folder is visible", landed
    again = traywise(*[a for a in args if a != "-q"], "-q", cwd=folder)
    if again.returncode != 0:
        return False, f"the next run failed: exit {again.returncode}: {again.stderr.strip()[-200:]}", landed
    left = [p.name for p in folder.iterdir() if p.name.startswith(".out.")]
    if left:
        return False, f"temporaries left after the next run: {left}", landed
    return True, "", landed


def concurrent_check(folder):
    """Three runs at once into one folder: each ends with exit 0 or a one-line refusal, no
    traceback; the folder is afterwards one complete results folder."""
    out = folder / "out"
    case = CASES / "acid-gas-vent-scrubber.toml"
    runs = [subprocess.Popen([sys.executable, "-m", "traywise.cli", "run", str(case), "--out", str(out), "-q",
                              "--no-plots"], cwd=folder, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
            for _ in range(3)]
    codes = []
    for run in runs:
        _, stderr = run.communicate(timeout=TIMEOUT)
        if "Traceback" in stderr or foreign_lines(stderr):
            return False, f"exit {run.returncode}: {stderr.strip()[-300:]}"
        codes.append(run.returncode)
    if 0 not in codes or any(code not in (0, 1, 2) for code in codes):
        return False, f"exit statuses {codes}"
    record = json.loads((out / "results.json").read_text())
    listed = (out / ".traywise-results").read_text()
    if "results.json" not in listed or not record.get("convergence"):
        return False, "the folder left is not a complete results folder"
    return True, f"exit statuses {sorted(codes)}"


# -- the battery ----------------------------------------------------------------------------------
def run_battery(valid=220, n_mutations=300, kills=12, seed=20261202, echo=print):
    """Run the three parts; return the counts (a dict) and the failures' reasons."""
    rng = random.Random(seed)
    counts = {"valid": {k: 0 for k in ("converged", "honest", "refused", "failure")},
              "mutations": {k: 0 for k in ("named", "refused", "accepted", "failure")},
              "kills": {"ok": 0, "failed": 0, "landed": 0}, "concurrent": {"ok": 0, "failed": 0}}
    problems = []
    with tempfile.TemporaryDirectory(prefix="traywise-battery-") as scratch:
        scratch = Path(scratch)
        for i in range(valid):
            folder = scratch / f"valid-{i}"
            folder.mkdir()
            command, case, features = valid_case(rng)
            outcome, reason = classify_valid(command, case, folder)
            counts["valid"][outcome] += 1
            if outcome in ("refused", "failure"):
                problems.append(("valid", i, features, reason, to_toml(case)))
        for i, (name, text, key, what) in enumerate(mutations(rng, n_mutations)):
            folder = scratch / f"mutation-{i}"
            folder.mkdir()
            outcome, reason = classify_mutation(text, key, folder)
            counts["mutations"][outcome] += 1
            if outcome in ("refused", "failure"):
                problems.append(("mutation", i, [name, key, what], reason, ""))
        for i in range(kills):
            folder = scratch / f"kill-{i}"
            folder.mkdir()
            sweep, sig = i % 2 == 1, (signal.SIGTERM, signal.SIGKILL)[(i // 2) % 2]
            ok, reason, landed = kill_check(rng, folder, sweep=sweep, sig=sig)
            counts["kills"]["ok" if ok else "failed"] += 1
            counts["kills"]["landed"] += landed
            if not ok:
                problems.append(("kill", i, ["sweep" if sweep else "run", sig.name], reason, ""))
        if kills:
            folder = scratch / "concurrent"
            folder.mkdir()
            ok, reason = concurrent_check(folder)
            counts["concurrent"]["ok" if ok else "failed"] += 1
            if not ok:
                problems.append(("concurrent", 0, [], reason, ""))
    return counts, problems


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--valid", type=int, default=220)
    parser.add_argument("--mutations", type=int, default=300)
    parser.add_argument("--kills", type=int, default=12)
    parser.add_argument("--seed", type=int, default=20261202)
    options = parser.parse_args()
    start = time.monotonic()
    counts, problems = run_battery(options.valid, options.mutations, options.kills, options.seed)
    print(f"reliability battery, seed {options.seed}, {time.monotonic() - start:.0f} s")
    v, m = counts["valid"], counts["mutations"]
    print(f"valid cases {sum(v.values())}: converged {v['converged']}, honest non-convergence {v['honest']}, "
          f"refused although valid {v['refused']} (must be 0), tracebacks and other failures {v['failure']} (must be 0)")
    print(f"mutations {sum(m.values())}: refused with file and key named {m['named']}, refused otherwise "
          f"{m['refused']}, accepted (still valid) {m['accepted']}, tracebacks and other failures {m['failure']}")
    print(f"kills: {counts['kills']['ok']} clean, {counts['kills']['failed']} not ({counts['kills']['landed']} "
          "signalled while running, the rest had finished); "
          f"concurrent runs: {counts['concurrent']['ok']} clean, {counts['concurrent']['failed']} not")
    for part, i, features, reason, text in problems:
        print(f"\n-- {part} {i} {features}: {reason}")
        if text and os.environ.get("BATTERY_SHOW_CASES"):
            print(text)
    bad = v["refused"] + v["failure"] + m["failure"] + counts["kills"]["failed"] + counts["concurrent"]["failed"]
    sys.exit(1 if bad else 0)


if __name__ == "__main__":
    main()
