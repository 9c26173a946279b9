"""Check a built bundle as a colleague without Python would use it.

    python packaging/check_bundle.py packaging/dist/ebullio-VERSION-linux-ARCH.tar.gz
    python packaging/check_bundle.py packaging/dist/ebullio

An archive is unpacked into a scratch folder first, so the check runs a copy
that has never seen this repository. Every bundled program runs with an emptied
environment: PATH=/usr/bin:/bin and a scratch HOME, nothing else (no virtual
environment, no PYTHONPATH or PYTHONHOME), from the scratch folder.

1. ``ebullio-rate --json`` on every bundled sample gives the same JSON as the
   source tree's command (``python -m gui.report.command --json``, the package's
   ebullio-rate) in this environment: the same exit status and every number
   equal (exact equality after parsing; no field is left out of the comparison).
2. ``ebullio-study`` (a three-point sweep on two worker processes) gives the same
   JSON as ``python -m rating.study_cli``; ``ebullio-rate --report`` writes a PDF
   with no screen (its first pages kept as pictures); ``ebullio-rate`` on a
   missing file exits 2 with one line and no traceback.
3. The desktop application starts offscreen on a sample and keeps running with
   no traceback; its picture mode opens a sample, rates it and writes the main
   window's picture (kept in packaging/dist/screenshots/ to look at).
4. install-desktop-entry.sh (into a scratch XDG_DATA_HOME) writes an entry that
   starts this folder's ebullio, desktop-file-validate accepts it, and the file
   type registers with update-mime-database and update-desktop-database, where
   those freedesktop tools are installed; --remove takes everything out again.
Exit status 0 when everything holds, 1 otherwise.
"""
from __future__ import annotations

import json
import os
import shutil
import subprocess
import sys
import tarfile
import tempfile
import time
from pathlib import Path

HERE = Path(__file__).resolve().parent
ROOT = HERE.parent
SHOTS = HERE / "dist" / "screenshots"
APP_SAMPLE = "pentane-vaporiser"      # the sample the desktop check opens
APP_ALIVE_S = 25                      # how long the started application must keep running


class Check:
    def __init__(self):
        self.failures = []

    def __call__(self, ok: bool, what: str) -> bool:
        print(f"  {'ok  ' if ok else 'FAIL'} {what}", flush=True)
        if not ok:
            self.failures.append(what)
        return ok


def minimal_env(home: Path, **extra) -> dict:
    return {"PATH": "/usr/bin:/bin", "HOME": str(home), **extra}


#: The one field that must differ between two runs: the time each case was rated.
TIME_STAMP = "provenance.rated_at"


def differences(a, b, where="$"):
    """Paths at which two parsed JSON documents differ (numbers compared exactly; only
    the rating's time stamp is left out)."""
    if where.endswith("." + TIME_STAMP):
        return []
    if type(a) is not type(b):
        return [f"{where}: {a!r} vs {b!r}"]
    if isinstance(a, dict):
        out = [f"{where}.{k}: only on one side" for k in sorted(set(a) ^ set(b))]
        for k in a.keys() & b.keys():
            out += differences(a[k], b[k], f"{where}.{k}")
        return out
    if isinstance(a, list):
        if len(a) != len(b):
            return [f"{where}: {len(a)} items vs {len(b)}"]
        return [d for i, (x, y) in enumerate(zip(a, b)) for d in differences(x, y, f"{where}[{i}]")]
    return [] if a == b else [f"{where}: {a!r} vs {b!r}"]


def check_headless(bundle: Path, home: Path, check: Check) -> None:
    samples = sorted((bundle / "_internal" / "samples").glob("*.ebullio"))
    check(len(samples) == len(list((ROOT / "samples").glob("*.ebullio"))),
          f"the bundle carries all {len(samples)} samples")
    for sample in samples:
        t0 = time.monotonic()
        frozen = subprocess.run([str(bundle / "ebullio-rate"), str(sample), "--json"],
                                capture_output=True, text=True, env=minimal_env(home),
                                cwd=bundle.parent)
        t1 = time.monotonic()
        source = subprocess.run([sys.executable, "-m", "gui.report.command",
                                 str(ROOT / "samples" / sample.name), "--json"],
                                capture_output=True, text=True, cwd=ROOT)
        t2 = time.monotonic()
        try:
            diff = differences(json.loads(frozen.stdout), json.loads(source.stdout))
        except json.JSONDecodeError as exc:
            diff = [f"not JSON ({exc}); stderr: {frozen.stderr.strip()[-300:]}"]
        cases = len(json.loads(source.stdout)["cases"]) if source.stdout.startswith("{") else "?"
        check(frozen.returncode == source.returncode and not diff,
              f"{sample.name}: {cases} cases, exit {frozen.returncode} (source {source.returncode}), "
              f"{'identical JSON' if not diff else f'{len(diff)} differences: ' + '; '.join(diff[:3])}"
              f" [bundle {t1 - t0:.1f} s, source {t2 - t1:.1f} s]")
    study = ["pentane-vaporiser.ebullio", "--case", "C5 vaporiser V-12 performance",
             "--vary", "tubes.length=2:4:3", "--json", "--workers", "2"]
    frozen = subprocess.run([str(bundle / "ebullio-study"), str(bundle / "_internal" / "samples" / study[0])]
                            + study[1:], capture_output=True, text=True, env=minimal_env(home))
    source = subprocess.run([sys.executable, "-m", "rating.study_cli", str(ROOT / "samples" / study[0])]
                            + study[1:], capture_output=True, text=True, cwd=ROOT)
    try:
        diff = differences(json.loads(frozen.stdout), json.loads(source.stdout))
    except json.JSONDecodeError as exc:
        diff = [f"not JSON ({exc}); stderr: {frozen.stderr.strip()[-300:]}"]
    check(frozen.returncode == source.returncode and not diff,
          f"ebullio-study, a sweep of 3 points on 2 worker processes: exit {frozen.returncode} "
          f"(source {source.returncode}), "
          f"{'identical JSON' if not diff else f'{len(diff)} differences: ' + '; '.join(diff[:3])}")
    pdf = home / "report.pdf"
    sample = bundle / "_internal" / "samples" / "stripper-reboiler.ebullio"
    t0 = time.monotonic()
    run = subprocess.run([str(bundle / "ebullio-rate"), str(sample), "--report", str(pdf)],
                         capture_output=True, text=True, env=minimal_env(home))
    written = pdf.exists() and pdf.read_bytes()[:5] == b"%PDF-"
    check(run.returncode in (0, 1) and written and "Traceback" not in run.stderr,
          f"ebullio-rate --report writes a PDF of {sample.name} with no screen "
          f"({pdf.stat().st_size if written else 0:,} bytes, exit {run.returncode}, "
          f"{time.monotonic() - t0:.0f} s)" + (f"; stderr: {run.stderr.strip()[-300:]}" if not written else ""))
    if written and shutil.which("pdftoppm"):
        SHOTS.mkdir(parents=True, exist_ok=True)
        subprocess.run(["pdftoppm", "-png", "-r", "60", "-f", "1", "-l", "2", str(pdf),
                        str(SHOTS / "report-page")], check=False)
    bad = subprocess.run([str(bundle / "ebullio-rate"), str(home / "no-such-file.ebullio")],
                         capture_output=True, text=True, env=minimal_env(home))
    lines = bad.stderr.strip().splitlines()
    check(bad.returncode == 2 and len(lines) == 1 and "Traceback" not in bad.stderr,
          f"a missing file: exit {bad.returncode}, stderr {lines!r}")


def check_app(bundle: Path, home: Path, check: Check) -> None:
    app = bundle / "ebullio"
    if not check(app.is_file(), "the desktop application is in the bundle"):
        return
    env = minimal_env(home, QT_QPA_PLATFORM="offscreen")
    sample = bundle / "_internal" / "samples" / f"{APP_SAMPLE}.ebullio"
    with tempfile.TemporaryFile("w+") as err:
        proc = subprocess.Popen([str(app), str(sample)], stdout=subprocess.DEVNULL, stderr=err,
                                env=env, cwd=home)
        try:
            proc.wait(timeout=APP_ALIVE_S)
        except subprocess.TimeoutExpired:
            pass
        alive = proc.poll() is None
        proc.terminate()
        try:
            proc.wait(timeout=10)
        except subprocess.TimeoutExpired:
            proc.kill()
            proc.wait()
        err.seek(0)
        text = err.read()
    check(alive and "Traceback" not in text,
          f"`ebullio {sample.name}` is still running after {APP_ALIVE_S} s"
          + (f"; stderr: {text.strip()[-400:]}" if text.strip() else ", nothing on stderr"))

    out = home / "shots"
    t0 = time.monotonic()
    shots = ["--screenshots", str(out), "--only", APP_SAMPLE]
    run = subprocess.run([str(app)] + shots, capture_output=True, text=True, env=env, cwd=home,
                         timeout=600)
    seconds = time.monotonic() - t0
    pictures = sorted(out.glob(f"{APP_SAMPLE}-*.png"))
    crashed = run.returncode != 0 or "Traceback" in run.stderr
    check(bool(pictures) and "Traceback" not in run.stderr,
          f"the application opened {sample.name}, rated it and wrote {len(pictures)} pictures "
          f"of the main window in {seconds:.0f} s")
    if crashed:
        # The same picture run from the source tree tells a fault of the bundle from
        # one of the application itself; the bundle must add none of its own.
        source = subprocess.run([sys.executable, "-m", "gui.screenshots", str(home / "source-shots"),
                                 "--only", APP_SAMPLE], capture_output=True, text=True, cwd=ROOT,
                                env={**os.environ, "QT_QPA_PLATFORM": "offscreen"}, timeout=600)
        last = (run.stderr.strip().splitlines() or [""])
        fatal = next((ln for ln in last if ln.startswith("Fatal")), last[-1])
        check(source.returncode == run.returncode,
              f"the picture run exits {run.returncode} ({fatal}); from the source tree it exits "
              f"{source.returncode}: {'a fault of the application, not of the bundle' if source.returncode == run.returncode else 'the bundle differs'}")
        print(f"  NOTE the application exits {run.returncode} after its pictures: {fatal}")
    if pictures:
        SHOTS.mkdir(parents=True, exist_ok=True)
        for p in sorted(out.glob("*.png")):
            shutil.copy2(p, SHOTS / p.name)
        print(f"  (pictures kept in {SHOTS.relative_to(ROOT)}/)")


def check_desktop_files(bundle: Path, home: Path, check: Check) -> None:
    data = home / "data"
    env = minimal_env(home, XDG_DATA_HOME=str(data))
    run = subprocess.run([str(bundle / "install-desktop-entry.sh")], capture_output=True, text=True,
                         env=env)
    entry = data / "applications" / "ebullio.desktop"
    exec_line = next((ln for ln in entry.read_text().splitlines() if ln.startswith("Exec=")), "") \
        if entry.exists() else ""
    check(run.returncode == 0 and exec_line == f'Exec="{bundle / "ebullio"}" %f',
          f"install-desktop-entry.sh installs the entry: {exec_line or run.stderr.strip()}")
    if shutil.which("desktop-file-validate"):
        v = subprocess.run(["desktop-file-validate", str(entry)], capture_output=True, text=True)
        check(v.returncode == 0 and not v.stdout.strip(),
              "desktop-file-validate accepts the installed entry" + (f": {v.stdout.strip()}" if v.stdout.strip() else ""))
    else:
        print("  (desktop-file-validate not installed: entry not validated)")
    if shutil.which("update-mime-database"):
        globs = (data / "mime" / "globs2").read_text() if (data / "mime" / "globs2").exists() else ""
        check("application/x-ebullio-project:*.ebullio" in globs,
              "update-mime-database registered *.ebullio as application/x-ebullio-project")
    else:
        print("  (update-mime-database not installed: file type not registered)")
    if shutil.which("update-desktop-database"):
        cache = data / "applications" / "mimeinfo.cache"
        text = cache.read_text() if cache.exists() else ""
        check("application/x-ebullio-project=ebullio.desktop;" in text,
              "update-desktop-database: .ebullio files open with the entry")
    run = subprocess.run([str(bundle / "install-desktop-entry.sh"), "--remove"], capture_output=True,
                         text=True, env=env)
    left = [str(p.relative_to(data)) for p in data.rglob("ebullio*") if p.is_file()]
    check(run.returncode == 0 and not left, f"--remove takes them out again (left: {left or 'nothing'})")


def main(argv=None) -> int:
    argv = sys.argv[1:] if argv is None else argv
    if len(argv) != 1 or argv[0].startswith("-"):
        print(__doc__)
        return 2
    given = Path(argv[0]).resolve()
    if not (tarfile.is_tarfile(given) if given.is_file() else (given / "ebullio").is_file()):
        print(f"check_bundle.py: {argv[0]} is neither a bundle archive nor an unpacked bundle "
              "folder (one holding the 'ebullio' program)", file=sys.stderr)
        return 2
    check = Check()
    shutil.rmtree(SHOTS, ignore_errors=True)
    with tempfile.TemporaryDirectory(prefix="ebullio-bundle-check-") as scratch:
        scratch = Path(scratch)
        if given.is_file():
            with tarfile.open(given) as tar:
                tar.extractall(scratch / "unpacked", filter="data")
            bundle = scratch / "unpacked" / "ebullio"
            print(f"check_bundle.py: {given.name} unpacked into a scratch folder")
        else:
            bundle = given
        home = scratch / "home"
        home.mkdir()
        print("headless command, every sample, against the source tree:")
        check_headless(bundle, home, check)
        print("desktop application, offscreen:")
        check_app(bundle, home, check)
        print("desktop entry and file type:")
        check_desktop_files(bundle, home, check)
    print(f"check_bundle.py: {'all checks passed' if not check.failures else f'{len(check.failures)} failed'}")
    return 1 if check.failures else 0


if __name__ == "__main__":
    sys.exit(main())
