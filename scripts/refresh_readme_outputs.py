#!/usr/bin/env python3
"""Rerun every `$ ./build/floatpitch ...` command of the README and put its real output under it.

Run from the top of the repository after a build: python3 scripts/refresh_readme_outputs.py
The output shown under a command is replaced by what the command prints now: its standard
output, and its standard error too when it fails (the message is what it shows). Commands run in
a scratch copy of scenarios/ and tests/ so that nothing in the tree is written; the window
command (./build/ui/...) is left as it is. `$ echo $?` lines and what follows them are kept.
"""
import os
import shutil
import subprocess
import sys
import tempfile


def main():
    root = os.path.abspath(os.path.join(os.path.dirname(__file__), ".."))
    path = os.path.join(root, "README.md")
    lines = open(path, encoding="utf-8").read().split("\n")
    work = tempfile.mkdtemp(prefix="fp-readme-")
    for d in ("scenarios", "tests"):
        shutil.copytree(os.path.join(root, d), os.path.join(work, d))
    os.symlink(os.path.join(root, "build"), os.path.join(work, "build"))
    out, i, in_block = [], 0, False
    while i < len(lines):
        line = lines[i]
        if line.startswith("```"):
            in_block = not in_block
            out.append(line)
            i += 1
            continue
        if not (in_block and line.startswith("$ ./build/floatpitch")):
            out.append(line)
            i += 1
            continue
        cmd = line[2:]
        out.append(line)
        while cmd.endswith("\\"):
            i += 1
            out.append(lines[i])
            cmd = cmd[:-1] + " " + lines[i].strip()
        i += 1
        shown = []
        while i < len(lines) and not lines[i].startswith("$ ") and not lines[i].startswith("```"):
            shown.append(lines[i])
            i += 1
        r = subprocess.run(cmd, shell=True, cwd=work, capture_output=True, text=True)
        # stdout as printed; stderr too when the command fails (its message is what it shows)
        new = (r.stdout + (r.stderr if r.returncode != 0 else "")).rstrip("\n").split("\n")
        out.extend(new)
        print(f"{cmd[:70]}: exit {r.returncode}, {len(new)} lines", file=sys.stderr)
    open(path, "w", encoding="utf-8").write("\n".join(out))
    shutil.rmtree(work, ignore_errors=True)


if __name__ == "__main__":
    main()
