#!/usr/bin/env python3
"""Size report of dist/: every file raw and gzipped (level 9), and the first load against its budget.

The first load is what a browser fetches when it opens the page: index.html and every file it
links (style sheets of any medium, preloads, the manifest, icons) or imports in a script; the
print style sheet, which the page links itself once its first plan shows, is not part of it. An on-demand module is a
worker's loader shim and what it loads. Their budgets are written here, in one place; the script
exits with 1 when either is over, which fails the test command.
Usage: size.py DIST OUT
"""
import gzip
import os
import re
import sys
from html.parser import HTMLParser

# Gzipped bytes the first load should not pass (issue 11: a field tablet on a weak mobile link).
FIRST_LOAD_BUDGET = 250_000
# Gzipped bytes each on-demand module (a worker's loader shim and what it loads) should not pass.
ON_DEMAND_BUDGET = 100_000
# Modules with a budget of their own. The boundary module (issue 14) carries geo's polygon
# intersection (i_overlay and its sorts, about 60 kB) and geographiclib's polygon area: measured
# 112.9 kB after geo's validation (DE-9IM, 29 kB) gave way to its segment intersection. It loads
# only when a boundary is given.
MODULE_BUDGETS = {"sharpfield-field": 120_000}


def gz(data: bytes) -> int:
    return len(gzip.compress(data, 9, mtime=0))


class _Links(HTMLParser):
    """The files a page loads before it runs: every file it links (style sheets, preloads, the
    manifest, icons), module
    imports and the WebAssembly named in its inline loader."""

    def __init__(self):
        super().__init__()
        self.names = []
        self._in_script = False

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        # Every file the page links: style sheets of any medium (a browser fetches a print sheet at
        # once too), preloads, the manifest and the icons.
        if tag == "link" and a.get("rel") in ("stylesheet", "modulepreload", "preload", "manifest", "icon", "apple-touch-icon"):
            self.names.append(a.get("href") or "")
        if tag == "script":
            if a.get("src"):
                self.names.append(a["src"])
            self._in_script = True

    def handle_endtag(self, tag):
        if tag == "script":
            self._in_script = False

    def handle_data(self, data):
        if self._in_script:
            self.names += re.findall(r"""(?:from|import\()\s*['"]([^'"]+\.js)['"]""", data)
            self.names += re.findall(r"""module_or_path:\s*['"]([^'"]+)['"]""", data)


def first_load(root: str) -> list:
    parser = _Links()
    parser.feed(open(os.path.join(root, "index.html"), encoding="utf-8").read())
    seen = ["index.html"]
    for name in parser.names:
        name = name[2:] if name.startswith("./") else name.lstrip("/")
        if name not in seen and os.path.isfile(os.path.join(root, name)):
            seen.append(name)
    return seen


def on_demand_modules(root: str) -> dict:
    """Each worker loader shim trunk writes (`*_loader.js`) with the files it loads."""
    modules = {}
    for name in sorted(os.listdir(root)):
        if name.endswith("_loader.js"):
            text = open(os.path.join(root, name), encoding="utf-8").read()
            parts = re.findall(r"""(?:importScripts|wasm_bindgen)\(\s*['"]([^'"]+)['"]""", text)
            files = [name] + [p[2:] if p.startswith("./") else p for p in parts]
            modules[name[: -len("_loader.js")]] = [f for f in files if os.path.isfile(os.path.join(root, f))]
    return modules


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
    for module, files in on_demand_modules(root).items():
        size = sum(sizes[f] for f in files)
        budget = MODULE_BUDGETS.get(module, ON_DEMAND_BUDGET)
        lines.append("on-demand module %s (%s): %d bytes gzipped; budget %d" % (module, ", ".join(files), size, budget))
        if size > budget:
            over = True
            lines.append("FAILED: the module %s is over its budget by %d bytes" % (module, size - budget))
    text = "\n".join(lines) + "\n"
    sys.stdout.write(text)
    os.makedirs(os.path.dirname(out), exist_ok=True)
    open(out, "w").write(text)
    return 1 if over else 0


if __name__ == "__main__":
    sys.exit(main())
