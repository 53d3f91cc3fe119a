"""The tables package is ours and stands on the standard library alone (DEVELOPERS.md layout)."""

import subprocess
import sys

MODULES = ("tables.errors", "tables.sizes", "tables.conductors", "tables.ampacity",
           "tables.ocpd", "tables.egc", "tables.impedance", "tables.raceway")

CHECK = f"""
import sys
before = set(sys.modules)
import tables
assert tables.GAUGEWALK_TABLES is True, "another package named 'tables' was imported"
for name in {MODULES!r}:
    __import__(name)
added = {{m.split('.')[0] for m in set(sys.modules) - before}}
third_party = sorted(added - set(sys.stdlib_module_names) - {{'tables'}})
print(','.join(third_party))
"""


def test_tables_import_only_the_standard_library_in_a_fresh_interpreter():
    # rule: tables/ may import the stdlib only, and never textual or rich
    done = subprocess.run([sys.executable, "-c", CHECK], capture_output=True, text=True,
                          check=False)
    assert done.returncode == 0, done.stderr
    assert done.stdout.strip() == ""
