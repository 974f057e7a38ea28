#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Package checks: packs the library and the tool into nuget/packages, checks what the packages hold,
# installs the tool from that folder into a temporary tool path and runs it, builds and runs a consumer
# project that restores the library from that folder, runs every docs/examples/*.cs file-based program
# and executes the notebook headless with dotnet-repl. Exits non-zero on the first failure.
# Usage: .ci/package-checks.sh            (from anywhere; about 3-5 minutes)
set -euo pipefail
cd "$(dirname "$0")/.."
ROOT="$PWD"
export DOTNET_CLI_TELEMETRY_OPTOUT=1 DOTNET_NOLOGO=1 DOTNET_SKIP_FIRST_TIME_EXPERIENCE=1
PKG="$ROOT/nuget/packages"
WORK="$(mktemp -d "${TMPDIR:-/tmp}/periodic-package-checks.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
step() { printf '\n== %s\n' "$*"; }
fail() { echo "package-checks: FAILED: $*" >&2; exit 1; }

step "structure schema: valid JSON Schema, every example conforms, a bad file does not"
python3 - <<'PY' || fail "structure schema"
import glob, json, sys
try:
    import jsonschema
except ImportError:
    print("  python3 jsonschema not installed: schema check skipped"); sys.exit(0)
schema = json.load(open("docs/structure.schema.json", encoding="utf-8"))
jsonschema.Draft202012Validator.check_schema(schema)
validator = jsonschema.Draft202012Validator(schema)
bad = 0
for path in sorted(glob.glob("docs/examples/structures/*.json")):
    errors = [e.message for e in validator.iter_errors(json.load(open(path, encoding="utf-8")))]
    print(f"  {'ok  ' if not errors else 'FAIL'} {path} {errors[:2] if errors else ''}")
    bad += bool(errors)
wrong = {"name": "x", "cell": [{"width": "5 parsecs", "potential": 0, "mass": 0.067}]}
if not list(validator.iter_errors(wrong)):
    print("  FAIL the schema accepts an unknown unit"); bad += 1
sys.exit(1 if bad else 0)
PY

step "pack"
rm -f "$PKG"/Periodic.*.nupkg "$PKG"/Periodic.*.snupkg "$PKG"/Periodic.Cli.*.nupkg "$PKG"/Periodic.Cli.*.snupkg
dotnet pack src/Periodic -c Release -v:q -nologo -p:ContinuousIntegrationBuild=true
dotnet pack src/Periodic.Cli -c Release -v:q -nologo -p:ContinuousIntegrationBuild=true
LIB="$(ls "$PKG"/Periodic.[0-9]*.nupkg | head -1)"
TOOL="$(ls "$PKG"/Periodic.Cli.[0-9]*.nupkg | head -1)"
VERSION="$(basename "$LIB" .nupkg)"; VERSION="${VERSION#Periodic.}"
echo "library $LIB, tool $TOOL, version $VERSION"

step "package contents"
python3 - "$LIB" "$TOOL" <<'PY'
import sys, zipfile, re
for path in sys.argv[1:]:
    z = zipfile.ZipFile(path)
    names = z.namelist()
    nuspec = z.read(next(n for n in names if n.endswith(".nuspec"))).decode("utf-8-sig")
    checks = {
        "README.md packed and declared": "README.md" in names and "<readme>README.md</readme>" in nuspec,
        "licence expression MIT": '<license type="expression">MIT</license>' in nuspec,
        "repository commit (SourceLink)": re.search(r'<repository [^>]*commit="[0-9a-f]{40}"', nuspec) is not None,
        "symbols package beside it": zipfile.is_zipfile(path[:-len(".nupkg")] + ".snupkg"),
    }
    if "Periodic.Cli." in path:
        checks["tool package (DotnetTool)"] = '<packageType name="DotnetTool"' in nuspec
    else:
        checks["library and XML docs"] = "lib/net10.0/Periodic.dll" in names and "lib/net10.0/Periodic.xml" in names
    for name, ok in checks.items():
        print(f"  {'ok  ' if ok else 'FAIL'} {path.rsplit('/', 1)[-1]}: {name}")
    if not all(checks.values()):
        sys.exit(1)
PY

# A package of the same version restored earlier would shadow the fresh one: drop those cache entries.
CACHE="${NUGET_PACKAGES:-$HOME/.nuget/packages}"
rm -rf "$CACHE/periodic/$VERSION" "$CACHE/periodic.cli/$VERSION"

step "tool: install from the folder into a temporary tool path and run it"
dotnet tool install Periodic.Cli --version "$VERSION" --add-source "$PKG" --tool-path "$WORK/tools" >/dev/null
"$WORK/tools/periodic" > "$WORK/default.txt" || fail "periodic (no arguments) exited with $?"
grep -q "bottom (eV)" "$WORK/default.txt" || fail "periodic (no arguments) printed no band table"
head -4 "$WORK/default.txt"
"$WORK/tools/periodic" bands docs/examples/structures/superlattice.json --json > "$WORK/bands.json"
python3 -c "import json,sys; d=json.load(open(sys.argv[1])); assert len(d['bands'])==4 and d['units']['energy']=='eV'" "$WORK/bands.json" \
  || fail "periodic bands --json gave unexpected output"
"$WORK/tools/periodic" plot docs/examples/structures/superlattice.json --out "$WORK/bands.png" 2>/dev/null
python3 -c "import sys; assert open(sys.argv[1],'rb').read(8)==b'\x89PNG\r\n\x1a\n'" "$WORK/bands.png" || fail "periodic plot wrote no PNG"
set +e; "$WORK/tools/periodic" bands /nonexistent.json 2>/dev/null; code=$?; set -e
[ "$code" = 2 ] || fail "bad input should exit with 2, got $code"
echo "  ok: table, JSON, PNG, exit code 2 on bad input"

step "consumer project restores the library from the folder"
dotnet run --project nuget/consumer -p:PeriodicVersion="$VERSION" -v:q

step "examples (file-based programs)"
for example in docs/examples/*.cs; do
  echo "-- dotnet run $example"
  dotnet run "$example" > "$WORK/example.out" 2>&1 || { cat "$WORK/example.out"; fail "$example"; }
  tail -3 "$WORK/example.out"
done

step "notebook (dotnet-repl, headless, against the packed library)"
dotnet tool restore >/dev/null
sed -e "s|nuget: ../nuget/packages|nuget: $PKG|" -e "s|nuget: Periodic, [0-9A-Za-z.+-]*\\\\\"|nuget: Periodic, $VERSION\\\\\"|" \
  docs/periodic-tour.ipynb > "$WORK/periodic-tour.ipynb"
grep -q "$PKG" "$WORK/periodic-tour.ipynb" || fail "could not point the notebook at $PKG"
set +e
(cd docs && dotnet tool run dotnet-repl -- --run "$WORK/periodic-tour.ipynb" --exit-after-run --output-format trx --output-path "$WORK/notebook.trx" > "$WORK/notebook.log" 2>&1)
code=$?
set -e
python3 - "$WORK/notebook.trx" "$code" <<'PY' || { tail -20 "$WORK/notebook.log"; fail "notebook"; }
import sys, re, html
trx = open(sys.argv[1], encoding="utf-8").read()
results = re.findall(r'<UnitTestResult[^>]*outcome="(\w+)"', trx)
failed = [m for m in re.finditer(r'<UnitTestResult[^>]*outcome="Failed"[^>]*>(.*?)</UnitTestResult>', trx, re.S)]
print(f"  {len(results)} cells, {len(failed)} failed, dotnet-repl exit code {sys.argv[2]}")
for m in failed:
    print("  " + re.sub(r"\s+", " ", re.sub(r"<[^>]+>", " ", html.unescape(html.unescape(m.group(1)))))[:400])
sys.exit(1 if failed or not results or sys.argv[2] != "0" else 0)
PY

step "package checks passed"
