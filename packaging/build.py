"""Build Ebullio's one-folder desktop bundle, pack it, and check it.

    python packaging/build.py              # build, pack, check (several minutes)
    python packaging/build.py --no-check   # build and pack only
    python packaging/build.py --measure-exclusions
                                           # also build once without the exclusions
                                           # and report what they save

Run from the repository root in the environment that has the project's
dependencies and PyInstaller. Writes packaging/dist/ebullio/ (the folder to hand
over), packaging/dist/ebullio-VERSION-linux-ARCH.tar.gz (the same folder packed)
and packaging/dist/build-report.json (the figures); packaging/build/ is
PyInstaller's scratch folder. None of these are committed.
"""
from __future__ import annotations

import argparse
import json
import os
import platform
import shutil
import subprocess
import sys
import tarfile
import time
import tomllib
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
DIST = HERE / "dist"
WORK = HERE / "build"
SPEC = HERE / "ebullio.spec"
# The headless commands: links to the one program, which picks the command by the
# name it was started under (launchers/ebullio.py); the same names as the package's.
COMMAND_LINKS = ("ebullio-rate", "ebullio-study")


def folder_size(path: Path) -> int:
    return sum(p.stat().st_size for p in path.rglob("*") if p.is_file() and not p.is_symlink())


def mib(n: int) -> str:
    return f"{n / 2**20:.1f} MiB"


def freeze(distpath: Path, workpath: Path, keep_all: bool) -> float:
    """Run PyInstaller on the spec; returns the seconds it took."""
    env = dict(os.environ)
    env.pop("EBULLIO_BUNDLE_KEEP_ALL", None)
    if keep_all:
        env["EBULLIO_BUNDLE_KEEP_ALL"] = "1"
    cmd = [sys.executable, "-m", "PyInstaller", "--noconfirm", "--log-level", "WARN",
           "--distpath", str(distpath), "--workpath", str(workpath), str(SPEC)]
    start = time.monotonic()
    subprocess.run(cmd, cwd=ROOT, env=env, check=True)
    return time.monotonic() - start


def finish(bundle: Path) -> None:
    """The command links, the .desktop entry, the file type, the icons, their
    installer and a read-me."""
    for name in COMMAND_LINKS:
        (bundle / name).unlink(missing_ok=True)
        (bundle / name).symlink_to("ebullio")          # relative: the folder can move
    share = bundle / "share"
    (share / "applications").mkdir(parents=True, exist_ok=True)
    shutil.copy2(HERE / "desktop" / "ebullio.desktop", share / "applications" / "ebullio.desktop")
    (share / "mime" / "packages").mkdir(parents=True, exist_ok=True)
    shutil.copy2(HERE / "desktop" / "ebullio-mime.xml", share / "mime" / "packages" / "ebullio.xml")
    for png in sorted((HERE / "icons").glob("ebullio-*.png")):
        size = png.stem.split("-")[1]
        target = share / "icons" / "hicolor" / f"{size}x{size}" / "apps"
        target.mkdir(parents=True, exist_ok=True)
        shutil.copy2(png, target / "ebullio.png")
    scalable = share / "icons" / "hicolor" / "scalable" / "apps"
    scalable.mkdir(parents=True, exist_ok=True)
    shutil.copy2(HERE / "icons" / "ebullio.svg", scalable / "ebullio.svg")
    shutil.copy2(HERE / "desktop" / "install-desktop-entry.sh", bundle / "install-desktop-entry.sh")
    shutil.copy2(HERE / "desktop" / "README.txt", bundle / "README.txt")


def pack(bundle: Path, version: str) -> Path:
    archive = DIST / f"ebullio-{version}-linux-{platform.machine()}.tar.gz"
    with tarfile.open(archive, "w:gz", compresslevel=6) as tar:
        tar.add(bundle, arcname=bundle.name)
    return archive


def main(argv=None) -> int:
    p = argparse.ArgumentParser(prog="packaging/build.py", description=__doc__.splitlines()[0])
    p.add_argument("--no-check", action="store_true", help="build and pack, but do not check")
    p.add_argument("--measure-exclusions", action="store_true",
                   help="also build without the exclusions (into packaging/build/) to measure them")
    args = p.parse_args(argv)
    try:
        import PyInstaller
    except ImportError:
        print("build.py: PyInstaller is not installed in this environment "
              "(pip install pyinstaller)", file=sys.stderr)
        return 2
    version = tomllib.loads((ROOT / "pyproject.toml").read_text())["project"]["version"]
    report = {"version": version, "pyinstaller": PyInstaller.__version__,
              "python": platform.python_version(), "machine": platform.machine()}

    bundle = DIST / "ebullio"
    report["freeze_s"] = round(freeze(DIST, WORK, keep_all=False), 1)
    finish(bundle)
    start = time.monotonic()
    archive = pack(bundle, version)
    report["pack_s"] = round(time.monotonic() - start, 1)
    report["bundle_bytes"] = folder_size(bundle)
    report["bundle_files"] = sum(1 for q in bundle.rglob("*") if q.is_file())
    report["archive"] = archive.name
    report["archive_bytes"] = archive.stat().st_size
    print(f"build.py: {bundle.relative_to(ROOT)}: {mib(report['bundle_bytes'])} in "
          f"{report['bundle_files']} files; {archive.name}: {mib(report['archive_bytes'])}; "
          f"frozen in {report['freeze_s']:.0f} s, packed in {report['pack_s']:.0f} s")

    if args.measure_exclusions:
        everything = WORK / "keep-all"
        report["keep_all_freeze_s"] = round(freeze(everything / "dist", everything / "work", True), 1)
        report["keep_all_bundle_bytes"] = folder_size(everything / "dist" / "ebullio")
        saved = report["keep_all_bundle_bytes"] - report["bundle_bytes"]
        print(f"build.py: without the exclusions the folder is "
              f"{mib(report['keep_all_bundle_bytes'])}; they save {mib(saved)}")

    status = 0
    if not args.no_check:
        start = time.monotonic()
        status = subprocess.run([sys.executable, str(HERE / "check_bundle.py"), str(archive)],
                                cwd=ROOT).returncode
        report["check_s"] = round(time.monotonic() - start, 1)
        report["check_passed"] = status == 0
    (DIST / "build-report.json").write_text(json.dumps(report, indent=1) + "\n")
    print(f"build.py: figures in {(DIST / 'build-report.json').relative_to(ROOT)}")
    return status


if __name__ == "__main__":
    sys.exit(main())
