"""What every command-line check shares: the binary under test (the first argument), named
checks that are counted, running the binary, and the closing "N passed, M failed" line with its
exit status. A check script: `from cli_check import binary, check, run, finish`."""
import os
import subprocess
import sys

binary = os.path.abspath(sys.argv[1])
_counts = {"passed": 0, "failed": 0}


def check(name, ok, detail=""):
    if ok:
        _counts["passed"] += 1
    else:
        _counts["failed"] += 1
        print(f"FAIL {name} {detail}")


def run(*args, **kwargs):
    """The binary with args; output captured as bytes (subprocess.CompletedProcess)."""
    return subprocess.run([binary, *args], capture_output=True, **kwargs)


def run_text(*args, **kwargs):
    """(exit status, stdout, stderr) as text."""
    r = run(*args, **kwargs)
    return r.returncode, r.stdout.decode(), r.stderr.decode()


def finish():
    print(f"{_counts['passed']} passed, {_counts['failed']} failed")
    sys.exit(1 if _counts["failed"] else 0)
