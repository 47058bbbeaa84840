#!/usr/bin/env python3
"""Trunk post-build hook: finishes dist/ so the page runs under a strict Content-Security-Policy.

Trunk writes a small inline module script that loads the WebAssembly. The policy allows scripts
only from the app's own origin plus that exact inline script, by its SHA-256 hash, so this hook
computes the hash after every build and writes the policy into index.html. It then writes the
service worker with the list of every built file (see static/sw.js), versioned by their contents.
"""
import base64
import hashlib
import os
import re
import sys

POLICY = (
    "default-src 'self'; script-src 'self' 'wasm-unsafe-eval' {hashes}; style-src 'self'; "
    "img-src 'self' data: blob:; font-src 'self'; connect-src 'self'; manifest-src 'self'; "
    "worker-src 'self'; object-src 'none'; base-uri 'none'; form-action 'none'"
)


def main() -> int:
    if len(sys.argv) == 3 and sys.argv[1] == "--sw-only":
        # Used by the offline test to stand in for a new deployment of an already built folder.
        write_service_worker(sys.argv[2])
        return 0
    staging = os.environ.get("TRUNK_STAGING_DIR")
    if not staging:
        print("post_build: TRUNK_STAGING_DIR is not set; run through trunk", file=sys.stderr)
        return 1
    index_path = os.path.join(staging, "index.html")
    with open(index_path, encoding="utf-8") as f:
        html = f.read()
    scripts = re.findall(r"<script(?![^>]*\bsrc=)[^>]*>(.*?)</script>", html, flags=re.S)
    hashes = " ".join(
        "'sha256-%s'" % base64.b64encode(hashlib.sha256(s.encode("utf-8")).digest()).decode()
        for s in scripts
    )
    if "CSP_PLACEHOLDER" not in html:
        print("post_build: index.html has no CSP_PLACEHOLDER", file=sys.stderr)
        return 1
    # Trunk's minifier may have dropped the quotes around the placeholder; the policy has spaces
    # and single quotes, so it is written in double quotes either way.
    html = re.sub(r"""(["']?)CSP_PLACEHOLDER\1""", lambda _: '"%s"' % POLICY.format(hashes=hashes), html)
    with open(index_path, "w", encoding="utf-8") as f:
        f.write(html)

    write_service_worker(staging)
    return 0


TEMPLATE = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "static", "sw.js")


def write_service_worker(staging: str) -> None:
    """Writes staging/sw.js from static/sw.js with the list of files and a version of their contents."""
    files = []
    digest = hashlib.sha256()
    for root, _, names in os.walk(staging):
        for name in sorted(names):
            path = os.path.join(root, name)
            rel = os.path.relpath(path, staging).replace(os.sep, "/")
            if rel == "sw.js":
                continue
            files.append(rel)
            with open(path, "rb") as f:
                digest.update(rel.encode() + b"\0" + f.read())
    files.sort()
    with open(TEMPLATE, encoding="utf-8") as f:
        sw = f.read()
    listing = ",\n  ".join('"./%s"' % ("" if rel == "index.html" else rel) for rel in files)
    sw = sw.replace("/*PRECACHE*/", listing).replace("BUILD_VERSION", digest.hexdigest()[:16])
    with open(os.path.join(staging, "sw.js"), "w", encoding="utf-8") as f:
        f.write(sw)


if __name__ == "__main__":
    sys.exit(main())
