#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Package checks, run by .ci/run after the test suite:
#  - the version scheme (MinVer): unique per commit in a full clone, a tagless clone and a shallow clone;
#  - packs the library and the per-platform tool packages into nuget/packages, checks what they hold and
#    their sizes against ceilings;
#  - installs the tool as a global tool (on PATH) and in a local tool manifest, exactly as docs/cli.md says,
#    and runs it; a consumer project and a file-based script restore exactly the build just packed;
#  - runs every docs/examples/*.cs file-based program;
#  - publishes the native library (NativeAOT), builds and runs the C ABI tests, the C and Fortran examples
#    and the Python module's tests, compares their band edges with the .NET tool's bit for bit, and
#    executes the Python notebook headless with the command docs/periodic-tour.ipynb gives.
# Needs gcc, gfortran and Debian's python3-numpy, python3-nbclient, jupyter-nbconvert, python3-ipykernel
# (.ci/run installs them). Exits non-zero on the first failure.
# Usage: bash .ci/package-checks.sh            (from anywhere; about 10-20 minutes on 2 cores)
#        bash .ci/package-checks.sh --native-only   (only the native library, its ABI tests, the examples, the Python
#                                                     module and the bitwise comparison, against `dotnet run` of the tool)
set -euo pipefail
NATIVE_ONLY=0
[ "${1:-}" = "--native-only" ] && NATIVE_ONLY=1
cd "$(dirname "$0")/.."
ROOT="$PWD"
export DOTNET_CLI_TELEMETRY_OPTOUT=1 DOTNET_NOLOGO=1 DOTNET_SKIP_FIRST_TIME_EXPERIENCE=1
PKG="$ROOT/nuget/packages"
NATIVE="$ROOT/artifacts/native"
PY=/usr/bin/python3   # Debian's interpreter, where python3-numpy and the Jupyter packages live
WORK="$(mktemp -d "${TMPDIR:-/tmp}/periodic-package-checks.XXXXXX")"
cleanup() {
  dotnet tool uninstall -g Periodic.Cli >/dev/null 2>&1 || true
  rm -rf "$WORK"
}
trap cleanup EXIT
STEP_START=$SECONDS
step() {
  [ -n "${STEP_NAME:-}" ] && printf '   (%s: %ds)\n' "$STEP_NAME" $((SECONDS - STEP_START))
  STEP_NAME="$1"; STEP_START=$SECONDS
  printf '\n== %s\n' "$*"
}
fail() { echo "package-checks: FAILED: $*" >&2; exit 1; }

if [ "$NATIVE_ONLY" = 0 ]; then
for tool in gcc g++ gfortran git "$PY"; do command -v "$tool" >/dev/null || fail "$tool is not installed (.ci/run installs it)"; done
"$PY" -c "import numpy, nbclient, ipykernel" 2>/dev/null || fail "Debian's python3-numpy, python3-nbclient and python3-ipykernel are needed (.ci/run installs them)"
command -v jupyter >/dev/null || fail "jupyter-nbconvert is not installed (.ci/run installs it)"

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

step "version scheme (MinVer): one version per commit, also without tags and in a shallow clone"
# The version MinVer gives the library project in a clone at its checked-out commit.
version_of() {
  (cd "$1" && dotnet msbuild src/Periodic/Periodic.csproj -restore -nologo -nodeReuse:false -v:q \
     -t:MinVer -getProperty:PackageVersion 2>"$WORK/minver.err" | tail -1) || { cat "$WORK/minver.err"; fail "MinVer in $1"; }
}
git clone -q --no-tags "file://$ROOT" "$WORK/clone"
git -C "$WORK/clone" tag -l | grep -q . && fail "the tagless clone has tags"
head_version="$(version_of "$WORK/clone")"
head_hash="$(git -C "$WORK/clone" rev-parse --short=8 HEAD)"
echo "  tagless clone at HEAD ($head_hash): $head_version"
if [ "$(git rev-parse --is-shallow-repository)" = true ]; then
  # The repository under test is itself shallow, so its clone is too: the shallow form is the right answer.
  [[ "$head_version" =~ ^1\.0\.0-alpha\.0\.shallow\.[0-9]{14}(\.[0-9]+)?\.g${head_hash}$ ]] || fail "untagged HEAD of a shallow clone should be 1.0.0-alpha.0.shallow.<time>[.<height>].g$head_hash, got $head_version"
else
  [[ "$head_version" =~ ^1\.0\.0-alpha\.0\.[0-9]+\.g${head_hash}$ ]] || fail "untagged HEAD should be 1.0.0-alpha.0.<height>.g$head_hash, got $head_version"
fi
if git -C "$WORK/clone" rev-parse -q --verify HEAD~1 >/dev/null; then
  git -C "$WORK/clone" checkout -q HEAD~1
  parent_version="$(version_of "$WORK/clone")"
  echo "  tagless clone at HEAD~1: $parent_version"
  [ "$parent_version" != "$head_version" ] || fail "HEAD and HEAD~1 share version $head_version"
  git -C "$WORK/clone" checkout -q -
else
  echo "  (the repository under test is a depth-1 clone: no parent to compare)"
fi
git -C "$WORK/clone" -c user.name=ci -c user.email=ci@localhost tag -a v9.8.7 -m "version check"
tagged_version="$(version_of "$WORK/clone")"
echo "  tagged v9.8.7: $tagged_version"
[ "$tagged_version" = "9.8.7" ] || fail "a commit tagged v9.8.7 should be version 9.8.7, got $tagged_version"
git -C "$WORK/clone" -c user.name=ci -c user.email=ci@localhost commit -q --allow-empty -m "after the tag"
after_version="$(version_of "$WORK/clone")"
echo "  one commit after v9.8.7: $after_version"
[[ "$after_version" =~ ^9\.8\.8-alpha\.0\.1\.g[0-9a-f]{8}$ ]] || fail "one commit after v9.8.7 should be 9.8.8-alpha.0.1.g<hash>, got $after_version"
git clone -q --depth 1 "file://$ROOT" "$WORK/shallow"
shallow_version="$(version_of "$WORK/shallow")"
echo "  depth-1 clone at HEAD: $shallow_version"
[[ "$shallow_version" =~ ^1\.0\.0-alpha\.0\.shallow\.[0-9]{14}(\.[0-9]+)?\.g${head_hash}$ ]] || fail "a shallow clone should carry the commit time and hash, got $shallow_version"
rm -rf "$WORK/clone" "$WORK/shallow"

step "pack: the library and the tool (a pointer package and one package per platform)"
rm -f "$PKG"/Periodic.*.nupkg "$PKG"/Periodic.*.snupkg
dotnet pack src/Periodic -c Release -v:q -nologo -p:ContinuousIntegrationBuild=true
dotnet pack src/Periodic.Cli -c Release -v:q -nologo -p:ContinuousIntegrationBuild=true
LIB="$(ls "$PKG"/Periodic.[0-9]*.nupkg | head -1)"
TOOL="$(ls "$PKG"/Periodic.Cli.[0-9]*.nupkg | head -1)"
VERSION="$(basename "$LIB" .nupkg)"; VERSION="${VERSION#Periodic.}"
[ "$(basename "$TOOL")" = "Periodic.Cli.$VERSION.nupkg" ] || fail "library and tool versions differ: $LIB, $TOOL"
echo "library $LIB, tool $TOOL, version $VERSION"
if [ -z "$(git status --porcelain --untracked-files=no 2>/dev/null)" ] && ! git tag --points-at HEAD | grep -q '^v'; then
  [[ "$VERSION" == *".g$(git rev-parse --short=8 HEAD)" ]] || fail "packed version $VERSION does not name commit $(git rev-parse --short=8 HEAD)"
fi

step "package contents and sizes"
"$PY" - "$PKG" "$VERSION" <<'PY' || fail "package contents or sizes"
import glob, os, re, sys, zipfile
folder, version = sys.argv[1], sys.argv[2]
# Ceilings: the library is managed code only; the pointer package holds only the tool's settings; a platform
# package holds the tool, its managed dependencies, the ReadyToRun code of Periodic, the tool and System.CommandLine
# (about 1 MB) and one platform's native plotting binaries (about 8.6 MB, 11.8 MB for macOS's universal binaries).
# Before per-platform packing the one tool package was 78 MB.
MB = 1024 * 1024
ceilings = {"library": 2 * MB, "pointer": 64 * 1024, "platform": 13 * MB}
rids = ["linux-x64", "linux-arm64", "linux-musl-x64", "osx-x64", "osx-arm64", "win-x64"]
expected = {f"Periodic.{version}.nupkg": "library", f"Periodic.Cli.{version}.nupkg": "pointer"}
expected.update({f"Periodic.Cli.{rid}.{version}.nupkg": "platform" for rid in rids})
found = {os.path.basename(p) for p in glob.glob(os.path.join(folder, "Periodic*.nupkg"))}
ok = True
if found != set(expected):
    print(f"  FAIL packages: missing {sorted(set(expected) - found)}, unexpected {sorted(found - set(expected))}"); ok = False
total = 0
for name, kind in sorted(expected.items()):
    path = os.path.join(folder, name)
    if not os.path.exists(path):
        continue
    z = zipfile.ZipFile(path)
    names = z.namelist()
    nuspec = z.read(next(n for n in names if n.endswith(".nuspec"))).decode("utf-8-sig")
    checks = {
        "licence expression MIT": '<license type="expression">MIT</license>' in nuspec,
        "repository commit (SourceLink)": re.search(r'<repository [^>]*commit="[0-9a-f]{40}"', nuspec) is not None,
    }
    if kind != "platform":
        checks["README.md packed and declared"] = "README.md" in names and "<readme>README.md</readme>" in nuspec
    if kind != "pointer":
        checks["symbols package beside it"] = zipfile.is_zipfile(path[:-len(".nupkg")] + ".snupkg")
    if kind == "library":
        checks["library and XML docs"] = "lib/net10.0/Periodic.dll" in names and "lib/net10.0/Periodic.xml" in names
    elif kind == "pointer":
        settings = z.read("tools/any/any/DotnetToolSettings.xml").decode("utf-8-sig")
        checks["tool package (DotnetTool) naming every platform package"] = '<packageType name="DotnetTool"' in nuspec and all(
            f'Id="Periodic.Cli.{rid}"' in settings for rid in rids)
        checks["no binaries"] = not any(n.endswith((".dll", ".so", ".dylib")) for n in names)
    else:
        rid = name[len("Periodic.Cli."):-len(f".{version}.nupkg")]
        skia = [n for n in names if re.search(r"/libSkiaSharp\.(so|dylib|dll)$", n)]
        checks[f"platform tool package (DotnetToolRidPackage) for {rid}"] = '<packageType name="DotnetToolRidPackage"' in nuspec
        checks["its own native binaries only (no runtimes/ folder of other platforms)"] = not any("/runtimes/" in n for n in names) and len(skia) == 1
    size = os.path.getsize(path)
    total += size
    checks[f"size {size / MB:.2f} MB within the ceiling of {ceilings[kind] / MB:.2f} MB"] = size <= ceilings[kind]
    for check, passed in checks.items():
        print(f"  {'ok  ' if passed else 'FAIL'} {name}: {check}")
        ok &= passed
print(f"  sizes: " + ", ".join(f"{n.replace('.' + version, '')} {os.path.getsize(os.path.join(folder, n)) / MB:.2f} MB" for n in sorted(found)))
print(f"  a user installs the pointer package and one platform package: "
      f"{(os.path.getsize(os.path.join(folder, f'Periodic.Cli.{version}.nupkg')) + os.path.getsize(os.path.join(folder, f'Periodic.Cli.linux-x64.{version}.nupkg'))) / MB:.2f} MB on linux-x64")
sys.exit(0 if ok else 1)
PY

# A package of the same version restored earlier would shadow the fresh one: drop those cache entries.
CACHE="${NUGET_PACKAGES:-$HOME/.nuget/packages}"
rm -rf "$CACHE/periodic/$VERSION" "$CACHE"/periodic.cli*/"$VERSION"

# Runs an installed `periodic` (a command line given as arguments) through the tool's smoke tests.
smoke_test() {
  local out; out="$("$@" --version)"
  [ "${out%%+*}" = "$VERSION" ] || fail "$* --version printed $out, packed $VERSION"
  "$@" > "$WORK/default.txt" || fail "$* (no arguments) exited with $?"
  grep -q "bottom (eV)" "$WORK/default.txt" || fail "$* (no arguments) printed no band table"
  "$@" bands docs/examples/structures/superlattice.json --json > "$WORK/bands.json"
  python3 -c "import json,sys; d=json.load(open(sys.argv[1])); assert len(d['bands'])==4 and d['units']['energy']=='eV'" "$WORK/bands.json" \
    || fail "$* bands --json gave unexpected output"
  "$@" plot docs/examples/structures/superlattice.json --out "$WORK/bands.png" 2>/dev/null
  python3 -c "import sys; assert open(sys.argv[1],'rb').read(8)==b'\x89PNG\r\n\x1a\n'" "$WORK/bands.png" || fail "$* plot wrote no PNG"
  set +e; "$@" bands /nonexistent.json 2>/dev/null; local code=$?; set -e
  [ "$code" = 2 ] || fail "bad input should exit with 2, got $code"
  echo "  ok: $* --version is $out; table, JSON, PNG, exit code 2 on bad input"
}

step "tool as a global tool (docs/cli.md): on PATH from ~/.dotnet/tools"
dotnet tool uninstall -g Periodic.Cli >/dev/null 2>&1 || true
dotnet tool install -g --add-source nuget/packages --prerelease Periodic.Cli
export PATH="$HOME/.dotnet/tools:$PATH"
[ "$(command -v periodic)" = "$HOME/.dotnet/tools/periodic" ] || fail "periodic is not on PATH from ~/.dotnet/tools (found: $(command -v periodic || echo nothing))"
smoke_test periodic
cp "$WORK/bands.json" "$WORK/dotnet-bands.json"   # the .NET result for the bitwise comparisons below

step "tool in a local tool manifest (docs/cli.md): dotnet periodic and dotnet tool run periodic"
mkdir -p "$WORK/project"
(cd "$WORK/project" && dotnet new tool-manifest >/dev/null && dotnet tool install --local --add-source "$PKG" --prerelease Periodic.Cli >/dev/null)
(cd "$WORK/project" && cp -r "$ROOT/docs" . && smoke_test dotnet periodic && smoke_test dotnet tool run periodic)

step "consumer project restores exactly the library just packed"
dotnet run --project nuget/consumer -p:PeriodicVersion="$VERSION" -v:q | tee "$WORK/consumer.txt"
loaded="$(sed -n 's/^consumer: OK, library //p' "$WORK/consumer.txt")"
[ "${loaded%%+*}" = "$VERSION" ] || fail "the consumer loaded library $loaded, packed $VERSION"

step "file-based script (#:package) restores exactly the library just packed"
mkdir -p "$WORK/script"
sed "s|^#:package Periodic@.*|#:package Periodic@$VERSION|" nuget/script/version.cs > "$WORK/script/version.cs"
sed "s|value=\"../packages\"|value=\"$PKG\"|" nuget/consumer/nuget.config > "$WORK/script/nuget.config"
loaded="$(cd "$WORK/script" && dotnet run version.cs)"
echo "  the script loaded library $loaded"
[ "${loaded%%+*}" = "$VERSION" ] || fail "the script loaded library $loaded, packed $VERSION"

step "examples (file-based programs)"
for example in docs/examples/*.cs; do
  echo "-- dotnet run $example"
  dotnet run "$example" > "$WORK/example.out" 2>&1 || { cat "$WORK/example.out"; fail "$example"; }
  tail -3 "$WORK/example.out"
done

else
  # The tool as built from this checkout, for the .NET side of the bitwise comparisons.
  for tool in gcc g++ gfortran "$PY"; do command -v "$tool" >/dev/null || fail "$tool is not installed"; done
  dotnet build src/Periodic.Cli -c Release -nologo -v:q
  periodic() { dotnet run --no-build -c Release --project "$ROOT/src/Periodic.Cli" -- "$@"; }
  periodic bands docs/examples/structures/superlattice.json --json > "$WORK/dotnet-bands.json"
fi

step "native library (NativeAOT): dotnet publish src/Periodic.Native -c Release -r linux-x64 -o artifacts/native"
rm -rf "$NATIVE"
dotnet publish src/Periodic.Native -c Release -r linux-x64 -o "$NATIVE" -nologo -v:q
ls -l "$NATIVE/libperiodic.so"
exports="$(nm -D --defined-only "$NATIVE/libperiodic.so" | awk '{print $3}' | sed 's/@.*//' | grep '^periodic_' | sort)"
declared="$(grep -o '^[a-z0-9_ ]*\bperiodic_[a-z_]*(' include/periodic.h | sed 's/.*\(periodic_[a-z_]*\)(/\1/' | sort)"
[ "$exports" = "$declared" ] || fail "exports and include/periodic.h differ: $(diff <(echo "$exports") <(echo "$declared") | tr '\n' ' ')"
echo "  $(echo "$exports" | wc -l) functions exported, exactly those declared in include/periodic.h"

step "C ABI tests (null pointers, short buffers, invalid layers, threads)"
gcc -std=c11 -Wall -Wextra -Werror -pthread -Iinclude tests/native/abi_test.c -L"$NATIVE" -lperiodic -lm -Wl,-rpath,'$ORIGIN' -o "$NATIVE/abi_test"
"$NATIVE/abi_test"

step "C, C++ and Fortran examples"
gcc -std=c11 -Wall -Wextra -Werror -Iinclude docs/embedding/c/example.c -L"$NATIVE" -lperiodic -Wl,-rpath,'$ORIGIN' -o "$NATIVE/example"
"$NATIVE/example" | tee "$WORK/c.txt"
gfortran -std=f2008 -Wall -Werror -J "$NATIVE" docs/embedding/fortran/example.f90 -L"$NATIVE" -lperiodic -Wl,-rpath,'$ORIGIN' -o "$NATIVE/example-fortran"
"$NATIVE/example-fortran" | tee "$WORK/fortran.txt"
g++ -std=c++17 -Wall -Wextra -Werror -Iinclude docs/embedding/cpp/example.cpp -L"$NATIVE" -lperiodic -Wl,-rpath,'$ORIGIN' -o "$NATIVE/example-cpp"
"$NATIVE/example-cpp" | tee "$WORK/cpp.txt"

step "Python module tests (with NumPy, and with plain lists)"
"$PY" -m unittest discover -s python/tests
python3 -c "import numpy" 2>/dev/null && echo "  (the default python3 has NumPy: plain-list run skipped)" || python3 -m unittest discover -s python/tests

step "bitwise agreement: band edges of the superlattice from C, Fortran, C++ and Python equal the .NET tool's"
"$PY" - "$WORK/dotnet-bands.json" "$WORK/c.txt" "$WORK/fortran.txt" "$WORK/cpp.txt" <<'PY' || fail "bitwise agreement"
import json, re, struct, sys
sys.path.insert(0, "python")
import periodic
bits = lambda x: struct.pack("<d", x).hex()
dotnet = {(b["index"], key): b[key] for b in json.load(open(sys.argv[1]))["bands"] for key in ("bottom", "top", "massAtBottom", "massAtTop")}
sources = {}
for label, path in (("C", sys.argv[2]), ("Fortran", sys.argv[3]), ("C++", sys.argv[4])):
    values = {}
    for line in open(path):
        if line.startswith("band "):
            words = line.split()
            for key, value in zip(words[2::2], words[3::2]):
                values[(int(words[1]), key)] = float(value.replace("E", "e"))
    sources[label] = values
bands = periodic.Cell([5.0, 2.0], [0.0, 0.25], [0.067, 0.092]).bands(4)
sources["Python"] = {(n + 1, key): float(getattr(bands, attr)[n]) for n in range(4)
                     for key, attr in (("bottom", "bottom_ev"), ("top", "top_ev"), ("massAtBottom", "bottom_mass_m0"), ("massAtTop", "top_mass_m0"))}
bad = 0
for label, values in sources.items():
    compared = [k for k in values if k in dotnet]
    differ = [k for k in compared if bits(values[k]) != bits(dotnet[k])]
    bad += len(differ) + (len(compared) < 8)
    print(f"  {'ok  ' if not differ and len(compared) >= 8 else 'FAIL'} {label}: {len(compared)} values bit for bit equal to the .NET tool's" if not differ else
          f"  FAIL {label}: " + "; ".join(f"{k}: {values[k]!r} vs {dotnet[k]!r}" for k in differ))
sys.exit(1 if bad else 0)
PY

step "bitwise agreement: intersubband transitions (C, Python) and Hubbard hopping (C, Python) equal the .NET tool's"
# The C example's stack (ten periods of the superlattice between leads like its barriers) and lattice (87Rb, 1064 nm, 12 E_R).
periodic transitions docs/examples/structures/superlattice.json --periods 10 --lead-potential 0.25 --lead-mass 0.092 --json > "$WORK/dotnet-transitions.json"
periodic hubbard docs/examples/structures/rubidium-lattice.json --scattering-length 100 --json > "$WORK/dotnet-hubbard.json"
"$PY" - "$WORK/dotnet-transitions.json" "$WORK/dotnet-hubbard.json" "$WORK/c.txt" <<'PY' || fail "bitwise agreement of transitions and hopping"
import json, struct, sys
sys.path.insert(0, "python")
import periodic
bits = lambda x: struct.pack("<d", x).hex()
# .NET: the tool's JSON writes |dipole| (the sign is a phase convention); compare magnitudes, which abs keeps exact.
transitions = json.load(open(sys.argv[1]))["transitions"]
hubbard = json.load(open(sys.argv[2]))
band = hubbard["bands"][0]
dotnet = {}
for t in transitions:
    dotnet[("transition", t["from"], t["to"], "energy")] = t["energy"]
    if t["resolved"]:
        dotnet[("transition", t["from"], t["to"], "dipole")] = t["dipole"]
        dotnet[("transition", t["from"], t["to"], "oscillatorStrength")] = t["oscillatorStrength"]
for n, j in enumerate(band["hopping"]):
    dotnet[("hopping", band["index"], f"J{n + 1}")] = j
dotnet[("hopping", band["index"], "wannierIntegral")] = band["wannierIntegral"]
dotnet[("hopping", band["index"], "meanEnergy")] = band["meanEnergy"]
c = {}
for line in open(sys.argv[3]):
    words = line.split()
    if line.startswith("transition ") and "not" not in words:
        for key, value in zip(words[3::2], words[4::2]):
            c[("transition", int(words[1]), int(words[2]), key)] = abs(float(value)) if key == "dipole" else float(value)
    elif line.startswith("hopping "):
        for key, value in zip(words[2::2], words[3::2]):
            c[("hopping", int(words[1]), key)] = float(value)
py = {}
stack = periodic.Cell([5.0, 2.0], [0.0, 0.25], [0.067, 0.092]).stack(10, (0.25, 0.092))
t = stack.transitions()
for k in range(t.count):
    key = ("transition", t.from_level[k], t.to_level[k])
    py[key + ("energy",)] = float(t.energy_ev[k])
    if t.resolved[k]:
        py[key + ("dipole",)] = abs(float(t.dipole_nm[k]))
        py[key + ("oscillatorStrength",)] = float(t.oscillator_strength[k])
w = periodic.Cell.optical_lattice(hubbard["wavelength"], hubbard["depth"], hubbard["mass"]).wannier(1)
for n, j in enumerate(w.hopping_ev):
    py[("hopping", 1, f"J{n + 1}")] = float(j)
py[("hopping", 1, "wannierIntegral")] = w.on_site_integral_per_nm
py[("hopping", 1, "meanEnergy")] = w.mean_energy_ev
bad = 0
for label, values in (("C", c), ("Python", py)):
    missing = sorted(set(dotnet) - set(values))
    differ = [k for k in dotnet if k in values and bits(values[k]) != bits(dotnet[k])]
    bad += len(differ) + len(missing)
    print(f"  {'ok  ' if not differ and not missing else 'FAIL'} {label}: {len(dotnet) - len(missing)} of {len(dotnet)} values "
          f"({len(transitions)} transitions, J1..J3 and the on-site integral) bit for bit equal to the .NET tool's")
    for k in differ[:5]:
        print(f"       {k}: {values[k]!r} vs {dotnet[k]!r}")
    for k in missing[:5]:
        print(f"       missing {k}")
sys.exit(1 if bad else 0)
PY

[ "$NATIVE_ONLY" = 1 ] && { step "native checks passed"; exit 0; }

step "notebook (Python, headless), the command docs/periodic-tour.ipynb gives"
jupyter nbconvert --to notebook --execute docs/periodic-tour.ipynb --output-dir artifacts/notebook > "$WORK/notebook.log" 2>&1 \
  || { tail -30 "$WORK/notebook.log"; fail "notebook"; }
"$PY" - artifacts/notebook/periodic-tour.ipynb <<'PY' || fail "notebook outputs"
import sys, nbformat
nb = nbformat.read(sys.argv[1], as_version=4)
cells = [c for c in nb.cells if c.cell_type == "code"]
errors = [o for c in cells for o in c.outputs if o.output_type == "error"]
unrun = [c for c in cells if c.execution_count is None]
print(f"  {len(cells)} code cells run, {len(errors)} errors, {len(unrun)} not run")
sys.exit(1 if errors or unrun or not cells else 0)
PY

step "package checks passed"
