#!/usr/bin/python3
"""Runs one shell command and appends its times to a file, finer than /usr/bin/time.

    timed_run.py TIMES INDEX COMMAND

appends the line "INDEX WALL USER SYSTEM MAXRSS" to TIMES: wall, user and system time in
seconds to the microsecond (/usr/bin/time prints hundredths, too coarse for runs of a tenth
of a second), and the peak resident memory in kB of the command's largest process. The
command runs as /usr/bin/time -f %M sh -c COMMAND: the times are wait4's (which /usr/bin/time's
own few hundred microseconds join), the memory /usr/bin/time's (a forked copy of this
Python process would count its own pages in wait4's figure). The exit status is passed on.
"""
import os
import sys
import tempfile
import time


def main() -> int:
    times, index, command = sys.argv[1], sys.argv[2], sys.argv[3]
    with tempfile.NamedTemporaryFile("r", encoding="ascii") as memory:
        start = time.perf_counter()
        pid = os.fork()
        if pid == 0:
            os.execv("/usr/bin/time", ["time", "-f", "%M", "-o", memory.name, "sh", "-c", command])
        _, status, usage = os.wait4(pid, 0)
        wall = time.perf_counter() - start
        peak_kb = memory.read().split()[-1]
    with open(times, "a", encoding="ascii") as out:
        out.write(f"{index} {wall:.6f} {usage.ru_utime:.6f} {usage.ru_stime:.6f} {peak_kb}\n")
    return os.waitstatus_to_exitcode(status)


if __name__ == "__main__":
    sys.exit(main())
