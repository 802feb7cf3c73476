#!/usr/bin/env python3
"""The desktop app's system switcher, driven through its real code path (GLFW window under Xvfb,
the ImGui text entry popup, the shared pick list) by tidewright-app --script: on a farm of 33
systems the Find field narrows the list as each character is typed and Escape restores it.

usage: check_native_switcher.py TIDEWRIGHT_CLI TIDEWRIGHT_APP SCRIPT
The farm is written as a journal file and restored into a fresh data directory by the command
line, as a keeper moving a farm to the desktop would.
"""
import json
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

LONG = "North greenhouse quarantine and grow-out raceway for the soft coral frags"


def farm() -> dict:
    units = {"alkalinity": "dKH", "calcium_magnesium": "mg/L", "temperature": "C", "ph_scale": "nbs", "volume": "L"}
    systems = [{"id": i + 1, "name": LONG if i == 1 else f"Rack {i + 1:02d}", "kind": "coral_grow_out",
                "volume_l": 400, "default_salinity": 35, "default_temperature_c": 25, "units": units,
                "targets": {}} for i in range(33)]
    return {"format": "tidewright-journal", "schema_version": 3, "next_id": 34,
            "description": "a farm of 33 systems (native switcher check)", "systems": systems, "events": []}


def main() -> int:
    cli, app, script = sys.argv[1:4]
    xvfb = shutil.which("xvfb-run")
    if not xvfb:
        print("FAIL: xvfb-run is not installed (Debian package xvfb; scripts/setup.sh installs it)")
        return 1
    with tempfile.TemporaryDirectory(prefix="tw-native-switcher-") as tmp:
        data = Path(tmp) / "data"
        data.mkdir()
        journal = Path(tmp) / "farm.json"
        journal.write_text(json.dumps(farm()))
        subprocess.run([cli, "log", "--journal", str(data / "tidewright-journal.db"), "restore", str(journal)],
                       check=True, capture_output=True, text=True)
        r = subprocess.run([xvfb, "-a", "-s", "-screen 0 1280x800x24", app, "--data", str(data), "--script", script],
                           capture_output=True, text=True, timeout=300)
        print(r.stdout, end="")
        if r.returncode != 0:
            print(r.stderr, end="")
            print(f"FAIL: tidewright-app --script exited {r.returncode}")
            return 1
        if "steps passed" not in r.stdout:
            print("FAIL: the script did not report its end")
            return 1
    print("ok: the desktop switcher's Find field narrows 33 -> 32 -> 4 as typed; Escape lists all 33")
    return 0


if __name__ == "__main__":
    sys.exit(main())
