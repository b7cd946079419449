"""Each layer includes only the layers to its left (DEVELOPERS.md, "The layers").

    units -> numerics -> fluids -> machines -> io -> charts -> cli

Every file under src/<layer>/ and include/shaftwork/<layer>/ is read for its
#include "shaftwork/<other>/..." lines; an include of a layer to the right fails the test,
naming the file, the line and the two layers.

    /usr/bin/python3 tests/python/test_layering.py [ignored binary path]
"""
import pathlib
import re
import sys

ORDER = ["units", "numerics", "fluids", "machines", "io", "charts", "cli"]
INCLUDE = re.compile(r'^\s*#\s*include\s*"shaftwork/([a-z_]+)/')


def layer_of(path):
    parts = path.parts
    if parts[0] == "src" and len(parts) > 2:
        return parts[1]
    if parts[0] == "include" and len(parts) > 3:
        return parts[2]
    return None


def main():
    root = pathlib.Path(".")
    files = [p for p in root.glob("src/**/*") if p.suffix in (".cpp", ".hpp")]
    files += [p for p in root.glob("include/shaftwork/**/*") if p.suffix == ".hpp"]
    problems = []
    checked = 0
    for path in sorted(files):
        layer = layer_of(path)
        if layer not in ORDER:
            continue
        checked += 1
        for number, line in enumerate(path.read_text(encoding="utf-8").split("\n"), 1):
            match = INCLUDE.match(line)
            if match and match.group(1) in ORDER and ORDER.index(match.group(1)) > ORDER.index(layer):
                problems.append(f"{path}:{number}: the {layer} layer includes the {match.group(1)} layer")
    for problem in problems:
        print("FAILED:", problem)
    print(f"{checked} files checked, {len(problems)} includes against the layering")
    assert checked > 50, "the source tree was not found (run from the repository's top)"
    sys.exit(1 if problems else 0)


if __name__ == "__main__":
    main()
