"""The README's performance tables, written from the output of `make bench` (tests/bench/run_all.py).

Usage: python tests/bench/run_all.py > bench.txt; python scripts/bench_table.py bench.txt
Prints Markdown: the kernel ratios at every N with goal and verdict, the one-orientation ratio, and the
window figures with their same-run baselines. Only ratios are taken from one run; absolute times depend
on the machine and its load and are printed as secondary."""

import re
import sys


def _section(text, name):
    match = re.search(rf"\[{name}\]\n(.*?)(?=\n\[|\Z)", text, re.S)
    return match.group(1) if match else ""


_KERNEL = re.compile(r"^(?P<name>.{42}) +(?P<n>[\d,]+) +(?P<ours>[\d.]+)ms +(?P<scipy>[\d.]+)ms +(?P<ratio>[\d.]+) +"
                     r"(?P<goal>[\d.]+) (?P<verdict>met|NOT MET) *(?:(?P<npq>[\d.]+)ms +(?P<npq_ratio>[\d.]+)"
                     r"(?: (?P<npq_verdict>met|NOT MET))?)?$")
_ONE = re.compile(r"^one orientation: matrix -> all editors +1 +(?P<ours>[\d.]+)µs +(?P<scipy>[\d.]+)µs +"
                  r"(?P<ratio>[\d.]+) +(?P<goal>[\d.]+) (?P<verdict>met|NOT MET)")


def kernel_table(text):
    rows = ["| conversion | N | ours / SciPy | goal | verdict | ours / numpy-quaternion (goal ≤ 1.0 at N ≥ 1e5 "
            "where marked) | ours | SciPy |", "|---|---|---|---|---|---|---|---|"]
    one = None
    for line in _section(text, "bench_kernels").splitlines():
        match = _KERNEL.match(line)
        if match:
            g = match.groupdict()
            peer = "" if g["npq_ratio"] is None else g["npq_ratio"]
            if g["npq_verdict"]:
                peer += f" ({'met' if g['npq_verdict'] == 'met' else '**not met**'})"
            verdict = "met" if g["verdict"] == "met" else "**not met**"
            rows.append(f"| {g['name'].strip().replace('->', '→')} | {g['n']} | {g['ratio']} | ≤ {g['goal']} | "
                        f"{verdict} | {peer} | {g['ours']} ms | {g['scipy']} ms |")
        one = one or _ONE.match(line)
    if one:
        verdict = "met" if one["verdict"] == "met" else "**not met**"
        rows += ["", "| one orientation | ours / SciPy | goal | verdict | ours | SciPy |", "|---|---|---|---|---|---|",
                 f"| matrix → everything the editors and the meter show | {one['ratio']} | ≤ {one['goal']} | "
                 f"{verdict} | {one['ours']} µs | {one['scipy']} µs |"]
    return "\n".join(rows)


def window_lines(text):
    """The window, Scene and start-up lines as they were printed (they carry their own baselines)."""
    out = []
    for name in ("bench_window", "bench_startup"):
        body = _section(text, name).strip("\n")
        if body:
            out += [f"{name}:", "```", body, "```"]
    return "\n".join(out)


if __name__ == "__main__":
    text = open(sys.argv[1], encoding="utf-8").read()
    print(kernel_table(text))
    print()
    print(window_lines(text))
