#!/usr/bin/env python3
"""Run every command the README shows, as printed, and fail if one does not do what it shows.

A command is a line of a fenced block that starts with "$ ./build/" (continued on the next
lines while it ends with a backslash). It runs from the top of a scratch copy of the
repository's scenarios and README inputs, with the build directory linked in, so nothing in
the source tree is written. The expected exit status is 0, unless the block goes on with
"$ echo $?" and a number, which is then the status expected. The window
(./build/ui/floatpitch-view) runs under xvfb-run and must still be up after a few seconds (it
is interactive: it does not exit by itself); where xvfb-run is missing it is skipped.

usage: readme_commands.py SOURCE_DIR BUILD_DIR WORK_DIR
"""
import os
import re
import shutil
import subprocess
import sys


def commands(readme):
    out, in_block, lines = [], False, readme.splitlines()
    i = 0
    while i < len(lines):
        line = lines[i]
        if line.startswith("```"):
            in_block = not in_block
            i += 1
            continue
        if in_block and line.startswith("$ ./build/"):
            cmd, lineno = line[2:], i + 1
            while cmd.endswith("\\") and i + 1 < len(lines):
                i += 1
                cmd = cmd[:-1] + " " + lines[i].strip()
            expect = 0
            shown = []  # the output lines the README shows under the command
            k = i + 1
            while k < len(lines) and not lines[k].startswith("$ ") and not lines[k].startswith("```"):
                shown.append(lines[k])
                k += 1
            # "$ echo $?" within the same block gives the expected status
            j = i + 1
            while j < len(lines) and not lines[j].startswith("```"):
                if lines[j].strip() == "$ echo $?" and j + 1 < len(lines):
                    expect = int(lines[j + 1].strip())
                    break
                if lines[j].startswith("$ ./build/"):
                    break
                j += 1
            out.append((lineno, cmd, expect, shown))
        i += 1
    return out


def main():
    src, build, work = sys.argv[1:4]
    readme = open(os.path.join(src, "README.md"), encoding="utf-8").read()
    cmds = commands(readme)
    if len(cmds) < 5:
        print(f"FAIL: found only {len(cmds)} commands in README.md: the parser is broken")
        return 1
    shutil.rmtree(work, ignore_errors=True)
    os.makedirs(work)
    for d in ("scenarios", "tests"):
        shutil.copytree(os.path.join(src, d), os.path.join(work, d))
    os.symlink(os.path.abspath(build), os.path.join(work, "build"))
    failures = 0
    xvfb = shutil.which("xvfb-run")
    for lineno, cmd, expect, shown in cmds:
        if cmd.startswith("./build/ui/"):
            if not xvfb:
                print(f"skip  README.md:{lineno}: {cmd} (no xvfb-run)")
                continue
            if not os.path.exists(os.path.join(build, "ui", "floatpitch-view")):
                print(f"skip  README.md:{lineno}: {cmd} (the window is not built)")
                continue
            full = f'timeout 6 xvfb-run -a -s "-screen 0 1280x800x24" {cmd}'
            r = subprocess.run(full, shell=True, cwd=work, capture_output=True, text=True,
                               env=dict(os.environ, ASAN_OPTIONS="detect_leaks=0"))
            ok = r.returncode == 124  # still up when timeout stopped it: it started and ran
        else:
            r = subprocess.run(cmd, shell=True, cwd=work, capture_output=True, text=True, timeout=900)
            ok = r.returncode == expect
            if ok and expect != 0 and shown:
                # a failure shown in the README: its first line must be what the program says
                ok = shown[0] in (r.stdout + r.stderr)
        print(f"{'ok  ' if ok else 'FAIL'}  README.md:{lineno}: {cmd}  (exit {r.returncode}, expected "
              f"{'running' if cmd.startswith('./build/ui/') else expect})")
        if not ok:
            failures += 1
            print("  stdout:", r.stdout[-2000:])
            print("  stderr:", r.stderr[-2000:])
    print(f"{len(cmds)} README commands, {failures} failed")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
