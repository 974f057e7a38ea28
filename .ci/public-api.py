#!/usr/bin/env python3
# SPDX-License-Identifier: MIT
# Records new public API, drops removed symbols (RS0017), and removes duplicate lines left by merges: builds the library, takes every RS0016 symbol the Public API analyzer
# reports, and appends it to src/<project>/PublicAPI.Unshipped.txt (sorted, unique).
# Usage: python3 .ci/public-api.py [src/Periodic]
import re, subprocess, sys, pathlib
project = pathlib.Path(sys.argv[1] if len(sys.argv) > 1 else "src/Periodic")
out = subprocess.run(["dotnet", "build", str(project), "--no-incremental", "-v:q", "-clp:NoSummary"],
                     capture_output=True, text=True).stdout
symbols = set(re.findall(r"error RS0016: Symbol '(.+?)' is not part of the declared public API", out))
# Symbols that were renamed or removed (RS0017) leave the file; the CHANGELOG records the migration.
removed = set(re.findall(r"error RS0017: Symbol '(.+?)' is part of the declared API, but is either not public or could not be found", out))
path = project / "PublicAPI.Unshipped.txt"
lines = [l for l in path.read_text().splitlines() if l and not l.startswith("#")]
# Union merges of two branches can repeat a line (RS0025); the file is always rewritten sorted and unique.
merged = sorted((set(lines) - removed) | symbols)
path.write_text("#nullable enable\n" + "\n".join(merged) + "\n")
print(f"added {len(symbols - set(lines))} and removed {len(removed & set(lines))} symbol(s) in {path}")
