#!/usr/bin/env python3
"""The key table is the one text of every key's meaning, unit and range; the parameter structs
point to it and repeat none of it.

Usage: param_pointers.py SOURCE_DIR        check the tree
       param_pointers.py SOURCE_DIR --self-test
                                           also show that the check refuses a wrong pointer,
                                           a missing one and a repeated range

What is checked (the structs of model/airplane.hpp, model/circuit.hpp and scenario/scenario_types.hpp that the
scenario keys fill):
  1. every field carries "// key NAME[, NAME...]" or "// not a key: ..." and nothing else that
     reads like the table (a unit in brackets, a range "(a..b)");
  2. every key a comment names exists in scenario/keys.cpp;
  3. every key of scenario/keys.cpp whose accessor reaches one of these fields is named in that
     very field's comment (so a comment cannot point at the wrong field).
"""
import re
import shutil
import sys
import tempfile
from pathlib import Path

HEADERS = ["model/airplane.hpp", "model/circuit.hpp", "scenario/scenario_types.hpp"]
CHECKED = {"LiftCurve", "WingBody", "Tail", "Elevator", "Circuit", "Propulsion", "MassProperties",
           "Condition", "RunSettings", "TrimSettings", "Envelope", "TurbulenceSettings",
           "GustDesign", "CircuitNonlinear"}
FIELD = re.compile(r"^\s+(?P<type>[\w:<>, ]+?)\s+(?P<name>\w+)(\s*=\s*[^;]*)?;(?P<rest>.*)$")


def parse_structs(text):
    """{struct: {field: (type, comment, line)}} for every struct in a header."""
    structs, cur = {}, None
    for number, line in enumerate(text.split("\n"), 1):
        m = re.match(r"struct (\w+) \{", line)
        if m:
            cur = m.group(1)
            structs[cur] = {}
            continue
        if line.startswith("};"):
            cur = None
            continue
        if cur is None or line.strip().startswith("//"):
            continue
        m = FIELD.match(line)
        if m and "(" not in m.group("type"):
            comment = m.group("rest").strip()
            comment = comment[2:].strip() if comment.startswith("//") else ""
            structs[cur][m.group("name")] = (m.group("type").strip(), comment, number)
    return structs


def parse_keys(text):
    """({key names}, {key: 'airplane.wing.area'-style path into Scenario, or None})"""
    names, paths = set(), {}
    for m in re.finditer(r'\{\.name = "([^"]+)"(.*?)(?=\{\.name = |\Z)', text, re.S):
        name, body = m.group(1), m.group(2)
        names.add(name)
        p = (re.search(r"FP_(?:NUM|INT|FLAG|TEXT)\(([\w.]+)\)", body)
             or re.search(r"get_choice = \[\]\(const Scenario& s\)[^{]*\{[^}]*?s\.([\w.]+)", body))
        paths[name] = p.group(1) if p else None
    return names, paths


def check(root):
    root = Path(root)
    structs = {}
    for h in HEADERS:
        for k, v in parse_structs((root / h).read_text()).items():
            structs[k] = (h, v)
    names, paths = parse_keys((root / "scenario/keys.cpp").read_text())
    errors = []
    named_by = {}  # (struct, field) -> set of keys its comment names
    for s in sorted(CHECKED):
        if s not in structs:
            errors.append(f"struct {s} not found in {HEADERS}")
            continue
        header, fields = structs[s]
        for field, (_, comment, line) in fields.items():
            where = f"{header}:{line}: {s}::{field}"
            if comment.startswith("not a key:"):
                continue
            m = re.match(r"key ([\w.]+(?:, [\w.]+)*)", comment)
            if not m:
                errors.append(f"{where}: no '// key NAME' pointer (comment: {comment!r})")
                continue
            keys = m.group(1).split(", ")
            named_by[(s, field)] = set(keys)
            for k in keys:
                if k not in names:
                    errors.append(f"{where}: names key {k!r}, which the key table does not have")
            if re.search(r"\[[^\]]*\]", comment) or re.search(r"\(\s*-?[\d.e+-]+\s*\.\.", comment):
                errors.append(f"{where}: repeats a unit or range of the key table: {comment!r}")
    # the Scenario members that hold these structs
    scenario = structs.get("Scenario", (None, {}))[1]
    for key, path in paths.items():
        if not path:
            continue
        parts = path.split(".")
        struct = "Scenario"
        fields = scenario
        owner, field = None, None
        for i, part in enumerate(parts):
            if part not in fields:
                errors.append(f"key {key}: path {path} does not resolve at {part!r}")
                owner = None
                break
            typ = fields[part][0]
            owner, field = struct, part
            if i + 1 < len(parts):
                struct = typ
                fields = structs.get(typ, (None, {}))[1]
        if owner is None or owner not in CHECKED:
            continue
        if key not in named_by.get((owner, field), set()):
            errors.append(f"key {key} sets {owner}::{field}, whose comment does not name it "
                          f"(names {sorted(named_by.get((owner, field), []))})")
    return errors


def self_test(root):
    """The check refuses three planted faults, each in a scratch copy of the tree."""
    faults = [
        ("model/airplane.hpp", "double span = 9.0;  // key wing.span",
         "double span = 9.0;  // key wing.mac"),
        ("model/airplane.hpp", "double cd0 = 0.03;  // key wing.cd0",
         "double cd0 = 0.03;  // zero-lift drag coefficient [-] (0..0.5)"),
        ("scenario/scenario_types.hpp", "double q_limit = 2.0;  // key run.q_limit",
         "double q_limit = 2.0;  // key run.q_limit [rad/s] (0.1..10)"),
    ]
    failures = []
    for path, old, new in faults:
        with tempfile.TemporaryDirectory() as tmp:
            for rel in HEADERS + ["scenario/keys.cpp"]:
                (Path(tmp) / rel).parent.mkdir(parents=True, exist_ok=True)
                shutil.copy(Path(root) / rel, Path(tmp) / rel)
            text = (Path(tmp) / path).read_text()
            if old not in text:
                failures.append(f"self-test: {path} no longer has {old!r}; update the self-test")
                continue
            (Path(tmp) / path).write_text(text.replace(old, new))
            if not check(tmp):
                failures.append(f"self-test: the check accepted the planted fault {new!r}")
    return failures


def main():
    if len(sys.argv) < 2:
        print(__doc__)
        return 2
    errors = check(sys.argv[1])
    if "--self-test" in sys.argv[2:]:
        errors += self_test(sys.argv[1])
    for e in errors:
        print(e)
    if errors:
        print(f"FAILED: {len(errors)} problem(s)")
        return 1
    print("parameter structs point to the key table, and it to them: ok")
    return 0


if __name__ == "__main__":
    sys.exit(main())
