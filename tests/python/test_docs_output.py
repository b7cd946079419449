"""The sessions shown in README.md and docs/*.md are what the tool prints today.

A fenced block whose first line is "$ shaftwork ARGS" is run (from the repository's top,
standard output only); every other line of the block must appear in the output, in order
and verbatim. A line "  ..." stands for lines left out; without one, the block's lines
must also follow each other in the output with nothing between them.

    /usr/bin/python3 tests/python/test_docs_output.py build/shaftwork
"""
import glob
import shlex
import subprocess
import sys


def sessions(path):
    """(line number, command, shown lines) of every "$ shaftwork" block of a Markdown file."""
    lines = open(path, encoding="utf-8").read().split("\n")
    found = []
    i = 0
    while i < len(lines):
        if lines[i].startswith("```") and i + 1 < len(lines) and lines[i + 1].startswith("$ shaftwork "):
            start = i + 1
            j = start + 1
            while j < len(lines) and not lines[j].startswith("```"):
                j += 1
            found.append((start + 1, lines[start][2:], lines[start + 1:j]))
            i = j
        i += 1
    return found


def matches(shown, output):
    """None when `shown` appears in `output` as described above, else the first line missing."""
    printed = output.split("\n")
    gaps = any(line.strip() == "..." for line in shown)
    wanted = [line for line in shown if line.strip() != "..."]
    if not wanted:
        return None
    if not gaps:
        for k in range(len(printed) - len(wanted) + 1):
            if printed[k:k + len(wanted)] == wanted:
                return None
        return wanted[0] if wanted[0] not in printed else "the block as one run of lines"
    at = 0
    for line in wanted:
        while at < len(printed) and printed[at] != line:
            at += 1
        if at == len(printed):
            return line
        at += 1
    return None


def main():
    binary = sys.argv[1]
    files = ["README.md"] + sorted(glob.glob("docs/*.md"))
    checked = 0
    failures = []
    for path in files:
        for number, command, shown in sessions(path):
            args = shlex.split(command)[1:]
            run = subprocess.run([binary] + args, capture_output=True, text=True, check=False)
            missing = matches(shown, run.stdout)
            checked += 1
            if missing is not None:
                failures.append(f"{path}:{number}: `{command}` no longer prints: {missing!r}")
    for failure in failures:
        print("FAILED:", failure)
    print(f"{checked} sessions checked, {len(failures)} differ")
    assert checked >= 2, "the README's walkthrough sessions were not found"
    sys.exit(1 if failures else 0)


if __name__ == "__main__":
    main()
