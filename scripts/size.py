#!/usr/bin/env python3
"""Size report of dist/: every file raw and gzipped (level 9), and the first load against its budget.

The first load is what the page needs to show its first plan: index.html and what it links as a
stylesheet (not one for print only), preloads, or imports in a script. Its budget is written here,
in one place; the script exits with 1 when the first load is over it, which fails the test command.
Usage: size.py DIST OUT
"""
import gzip
import os
import re
import sys

# Gzipped bytes the first load should not pass (issue 11: a field tablet on a weak mobile link).
FIRST_LOAD_BUDGET = 250_000


def gz(data: bytes) -> int:
    return len(gzip.compress(data, 9, mtime=0))


def first_load(root: str) -> list:
    html = open(os.path.join(root, "index.html"), encoding="utf-8").read()
    names = ["index.html"]
    for tag in re.findall(r"<link\b[^>]*>", html):
        rel = re.search(r'\brel="([^"]+)"', tag)
        href = re.search(r'\bhref="([^"]+)"', tag)
        if not rel or not href:
            continue
        if rel.group(1) in ("stylesheet", "modulepreload", "preload") and 'media="print"' not in tag:
            names.append(href.group(1))
    names += re.findall(r"""(?:from|import\()\s*['"]([^'"]+\.js)['"]""", html)
    names += re.findall(r"""module_or_path:\s*['"]([^'"]+)['"]""", html)
    seen = []
    for name in names:
        name = name.lstrip("./")
        if name not in seen and os.path.isfile(os.path.join(root, name)):
            seen.append(name)
    return seen


def main() -> int:
    root, out = sys.argv[1], sys.argv[2]
    rows = []
    for base, _, names in os.walk(root):
        for name in sorted(names):
            path = os.path.join(base, name)
            data = open(path, "rb").read()
            rows.append((os.path.relpath(path, root), len(data), gz(data)))
    rows.sort()
    width = max([len(r[0]) for r in rows] + [5])
    lines = ["%-*s %10s %10s" % (width, "file", "raw", "gzip")]
    lines += ["%-*s %10d %10d" % (width, n, r, g) for n, r, g in rows]
    lines.append("%-*s %10d %10d" % (width, "total", sum(r[1] for r in rows), sum(r[2] for r in rows)))
    sizes = {n: g for n, _, g in rows}
    load = first_load(root)
    total = sum(sizes[n] for n in load)
    lines.append("")
    lines.append("first load (%s): %d bytes gzipped; budget %d" % (", ".join(load), total, FIRST_LOAD_BUDGET))
    over = total > FIRST_LOAD_BUDGET
    if over:
        lines.append("FAILED: the first load is over its budget by %d bytes" % (total - FIRST_LOAD_BUDGET))
    else:
        lines.append("within the budget, %d bytes to spare" % (FIRST_LOAD_BUDGET - total))
    text = "\n".join(lines) + "\n"
    sys.stdout.write(text)
    os.makedirs(os.path.dirname(out), exist_ok=True)
    open(out, "w").write(text)
    return 1 if over else 0


if __name__ == "__main__":
    sys.exit(main())
