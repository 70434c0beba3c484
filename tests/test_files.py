"""Output files and input files: nothing replaced that is not ours, nothing half-written,
one-line errors for every file a user can hand us (the reproductions of issue 9 §1, §2).

Behaviour is checked against POSIX semantics (rename(2), renameat2(2), mkfifo(3),
umask(2)); no physics here.
"""

import errno
import os
import signal
import stat
import subprocess
import sys
import threading
import time
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from pipeins import fileio
from pipeins.errors import InputError

ROOT = Path(__file__).resolve().parents[1]
CHECK = ["check", "--pipe", "NPS 2", "--fluid-temp", "150C", "--layer", "mineral wool:50mm"]
CSV = {"lines.csv": "tag,length\nA,1\n", "schedule.csv": "size,thickness\nNPS 2,50\n", "totals.csv": "x\n1\n"}


def temporaries(folder):
    return sorted(p.name for p in Path(folder).iterdir() if p.name.startswith(".pipeins-"))


@pytest.fixture
def umask():
    """Set the umask for a test; restored after it."""
    saved = os.umask(0o022)
    os.umask(saved)

    def _set(mask):
        os.umask(mask)

    yield _set
    os.umask(saved)


def check_text(run):
    code, out, err = run(*CHECK)
    assert code == 0, err
    return out


# -- one output file --------------------------------------------------------------------

def test_symlink_target_written_and_link_kept(run, tmp_path):
    target = tmp_path / "report.txt"
    target.write_text("old\n")
    target.chmod(0o640)
    link = tmp_path / "link.txt"
    link.symlink_to("report.txt")
    code, out, err = run(*CHECK, "-o", str(link))
    assert (code, out, err) == (0, "", "")
    assert link.is_symlink() and os.readlink(link) == "report.txt"
    assert target.read_text() == check_text(run)
    assert stat.S_IMODE(target.stat().st_mode) == 0o640  # an existing file keeps its mode
    assert temporaries(tmp_path) == []


def test_dangling_symlink_creates_its_target(tmp_path):
    link = tmp_path / "link.txt"
    link.symlink_to("made.txt")
    fileio.write_text_output(str(link), "hello\n")
    assert link.is_symlink() and (tmp_path / "made.txt").read_text() == "hello\n"


def test_fifo_written_straight_and_read_back(run, tmp_path):
    fifo = tmp_path / "pipe"
    os.mkfifo(fifo)
    got = []
    reader = threading.Thread(target=lambda: got.append(fifo.read_text()))
    reader.start()
    code, out, err = run(*CHECK, "-o", str(fifo))
    reader.join(10)
    assert (code, err) == (0, "")
    assert stat.S_ISFIFO(os.lstat(fifo).st_mode)  # still a pipe, not replaced by a file
    assert got == [check_text(run)]
    assert temporaries(tmp_path) == []


def test_dash_is_standard_output(run):
    code, out, err = run(*CHECK, "-o", "-")
    assert (code, err) == (0, "")
    assert out == check_text(run)
    assert "Heat flow check" in out


def test_device_refused_before_anything_is_opened(run, monkeypatch):
    """/dev/null is a character device that is not a terminal: refused, and never opened
    (a guard fails the test if anything opens it)."""
    opened = []
    real_os_open, real_open = os.open, open

    def guard_os_open(path, *args, **kw):
        if os.fspath(path) == os.devnull:
            opened.append(path)
            raise AssertionError("opened the device")
        return real_os_open(path, *args, **kw)

    def guard_open(path, *args, **kw):
        if not isinstance(path, int) and os.fspath(path) == os.devnull:
            opened.append(path)
            raise AssertionError("opened the device")
        return real_open(path, *args, **kw)

    monkeypatch.setattr(os, "open", guard_os_open)
    monkeypatch.setattr("builtins.open", guard_open)
    code, out, err = run(*CHECK, "-o", os.devnull)
    assert (code, out) == (2, "")
    assert err == ("Error: --output: /dev/null is a device, not a file; "
                   "give a file path or - for standard output\n")
    assert opened == []


def test_terminal_written_straight():
    """A pseudo-terminal (a character device that is a tty) is written, not replaced."""
    master, slave = os.openpty()
    try:
        name = os.ttyname(slave)
        fileio.write_text_output(name, "to the terminal\n")
        assert stat.S_ISCHR(os.stat(name).st_mode)
        assert b"to the terminal" in os.read(master, 1000)
    finally:
        os.close(slave)
        os.close(master)


def test_folder_and_socket_refused(tmp_path):
    with pytest.raises(InputError) as info:
        fileio.write_text_output(str(tmp_path), "x")
    assert str(info.value) == f"--output: {tmp_path} is a folder, not a file; give a file path or - for standard output"
    import socket

    path = tmp_path / "s"
    sock = socket.socket(socket.AF_UNIX)
    try:
        sock.bind(str(path))
        with pytest.raises(InputError) as info:
            fileio.write_text_output(str(path), "x")
        assert str(info.value) == f"--output: {path} is a socket, not a file; give a file path or - for standard output"
    finally:
        sock.close()


def test_stdout_path_redirected_to_a_file_is_appended_not_replaced(tmp_path):
    """``-o /dev/stdout`` with standard output sent to a file writes into that open file."""
    out = tmp_path / "out.txt"
    script = "from pipeins import fileio; print('before', flush=True); fileio.write_text_output('/dev/stdout', 'after\\n')"
    with open(out, "w") as fh:
        inode = os.fstat(fh.fileno()).st_ino
        subprocess.run([sys.executable, "-c", script], stdout=fh, check=True, cwd=ROOT,
                       env={**os.environ, "PYTHONPATH": str(ROOT)})
    assert out.read_text() == "before\nafter\n"
    assert out.stat().st_ino == inode


@pytest.mark.parametrize("where, code, reason", [
    ("os.replace", errno.EROFS, "Read-only file system"),
    ("write", errno.ENOSPC, "No space left on device"),
    ("os.open", errno.EACCES, "Permission denied"),
])
def test_os_errors_become_one_line_and_leave_no_temporary(run, tmp_path, monkeypatch, where, code, reason):
    """Read-only file system, full disk, permission: as root the permissions cannot be
    tested with chmod, so the system calls are made to fail as the kernel would."""
    target = tmp_path / "report.txt"
    target.write_text("old\n")

    def fail(*args, **kw):
        raise OSError(code, os.strerror(code))

    if where == "os.replace":
        monkeypatch.setattr(os, "replace", fail)
    elif where == "write":
        monkeypatch.setattr(fileio, "_write_fd", fail)
    else:
        monkeypatch.setattr(os, "open", fail)
    result = run(*CHECK, "-o", str(target))
    assert result == (2, "", f"Error: --output: cannot write {target}: {reason}\n")
    assert target.read_text() == "old\n"
    assert temporaries(tmp_path) == []


def test_missing_folder_and_read_only_file(tmp_path):
    with pytest.raises(InputError) as info:
        fileio.write_text_output(str(tmp_path / "no" / "x.txt"), "x")
    assert str(info.value) == f"--output: cannot write {tmp_path}/no/x.txt: the folder {tmp_path}/no does not exist"
    if os.geteuid() != 0:  # root may write a read-only file; the EACCES case above covers it
        target = tmp_path / "ro.txt"
        target.write_text("old\n")
        target.chmod(0o444)
        with pytest.raises(InputError, match="Permission denied"):
            fileio.write_text_output(str(target), "x")
        assert target.read_text() == "old\n"


def test_new_files_honour_the_umask(umask, tmp_path):
    umask(0o022)
    fileio.write_text_output(str(tmp_path / "a.txt"), "x")
    assert stat.S_IMODE((tmp_path / "a.txt").stat().st_mode) == 0o644
    umask(0o027)
    fileio.write_text_output(str(tmp_path / "b.txt"), "x")
    assert stat.S_IMODE((tmp_path / "b.txt").stat().st_mode) == 0o640


def test_new_folders_honour_the_umask(umask, tmp_path):
    umask(0o022)
    fileio.write_folder(str(tmp_path / "out"), CSV)
    assert stat.S_IMODE((tmp_path / "out").stat().st_mode) == 0o755
    assert {stat.S_IMODE(p.stat().st_mode) for p in (tmp_path / "out").iterdir()} == {0o644}
    umask(0o077)
    fileio.write_folder(str(tmp_path / "private"), CSV)
    assert stat.S_IMODE((tmp_path / "private").stat().st_mode) == 0o700
    assert {stat.S_IMODE(p.stat().st_mode) for p in (tmp_path / "private").iterdir()} == {0o600}


# -- signals and killed runs ------------------------------------------------------------

def run_script(script, *args, timeout=60):
    return subprocess.run([sys.executable, "-c", script, *map(str, args)], cwd=ROOT, capture_output=True,
                          text=True, timeout=timeout, env={**os.environ, "PYTHONPATH": str(ROOT)})


SIGNAL_WRITE = """
import os, signal, sys
from pipeins import fileio
sig = getattr(signal, sys.argv[1])
real = fileio._write_fd
def write(fd, data):
    os.kill(os.getpid(), sig)
    real(fd, data)
fileio._write_fd = write
if sys.argv[2] == "file":
    fileio.write_text_output(sys.argv[3], "new\\n")
else:
    fileio.write_folder(sys.argv[3], {"lines.csv": "new\\n"})
print("finished")
"""


@pytest.mark.parametrize("sig", ["SIGTERM", "SIGINT"])
@pytest.mark.parametrize("kind", ["file", "folder"])
def test_signal_mid_write_removes_the_temporary(tmp_path, sig, kind):
    target = tmp_path / ("report.txt" if kind == "file" else "out")
    if kind == "file":
        target.write_text("old\n")
    else:
        target.mkdir()
        (target / "lines.csv").write_text("old\n")
    proc = run_script(SIGNAL_WRITE, sig, kind, target)
    assert "finished" not in proc.stdout
    if sig == "SIGTERM":
        assert proc.returncode == -signal.SIGTERM  # died of the signal, as without pipeins' handler
    else:
        assert "KeyboardInterrupt" in proc.stderr
    assert (target.read_text() if kind == "file" else (target / "lines.csv").read_text()) == "old\n"
    assert temporaries(tmp_path) == []


KILL_SWAP = """
import os, signal, sys
from pipeins import fileio
step, target = sys.argv[1], sys.argv[2]
def die(*args, **kw):
    os.kill(os.getpid(), signal.SIGKILL)
if step == "building":
    real = fileio._write_fd
    calls = []
    def write(fd, data):
        calls.append(1)
        if len(calls) == 2:
            die()
        real(fd, data)
    fileio._write_fd = write
elif step == "exchange":
    fileio._renameat2 = die
elif step == "between-renames":
    fileio._renameat2 = lambda src, dst, flags: False
    real_rename = os.rename
    def rename(src, dst):
        if not os.path.basename(src).endswith(".tmp"):
            return real_rename(src, dst)  # the old folder set aside
        die()  # before the new folder is put in place
    os.rename = rename
fileio.write_folder(target, {"lines.csv": "new\\n", "schedule.csv": "new\\n", "totals.csv": "new\\n"})
"""


@pytest.mark.parametrize("step", ["building", "exchange", "between-renames"])
def test_kill_mid_write_keeps_the_old_folder_and_the_next_run_cleans_up(tmp_path, step):
    out = tmp_path / "out"
    out.mkdir()
    for name in CSV:
        (out / name).write_text("old\n")
    proc = run_script(KILL_SWAP, step, out)
    assert proc.returncode == -signal.SIGKILL
    assert temporaries(tmp_path)  # the killed run left its temporary behind
    if step == "between-renames":
        assert not out.exists()  # the old folder is set aside under a temporary name ...
        fileio.clean_stale(str(tmp_path))  # ... and the next run puts it back first
        assert temporaries(tmp_path) == []
    assert {p.name: p.read_text() for p in out.iterdir()} == dict.fromkeys(CSV, "old\n")
    fileio.write_folder(str(out), CSV)  # the next run removes the dead process's temporaries
    assert {p.name: p.read_text() for p in out.iterdir()} == CSV
    assert temporaries(tmp_path) == []


def test_stale_temporary_of_a_live_process_is_kept_until_a_minute_old(tmp_path):
    live = tmp_path / f".pipeins-out-{os.getppid()}-0123456789ab.tmp"
    live.mkdir()
    fileio.clean_stale(str(tmp_path))
    assert live.exists()  # may be another run at work
    old = time.time() - 2 * fileio.STALE_AFTER_S
    os.utime(live, (old, old))
    fileio.clean_stale(str(tmp_path))
    assert not live.exists()


# -- a folder of CSV files ----------------------------------------------------------------

@pytest.mark.parametrize("exchange", [True, False], ids=["renameat2-exchange", "two-renames"])
def test_existing_folder_swapped_whole(tmp_path, monkeypatch, exchange):
    if not exchange:
        monkeypatch.setattr(fileio, "_renameat2", lambda src, dst, flags: False)
    out = tmp_path / "out"
    out.mkdir()
    out.chmod(0o750)
    (out / "lines.csv").write_text("old\n")
    (out / "retired.csv").write_text("from an older run\n")
    inode = out.stat().st_ino
    fileio.write_folder(str(out), CSV)
    assert {p.name: p.read_text() for p in out.iterdir()} == CSV  # no old file left beside the new
    assert out.stat().st_ino != inode  # a new folder, swapped in
    assert stat.S_IMODE(out.stat().st_mode) == 0o750  # an existing folder keeps its mode
    assert temporaries(tmp_path) == []


TINY = """# invented: one line of the fictional Harrow Fen pump house
[project]
name = "Harrow Fen pump house (invented)"

[conditions.hall]
air = "20 C"

[services.hot]
fluid = "water"
temperature = "80 C"
material = "mineral wool"
criteria = ["touch"]

[[lines]]
tag = "H-1"
service = "hot"
size = "NPS 2"
length = "10 m"
condition = "hall"
"""


def tiny_project(tmp_path, prefix=""):
    path = tmp_path / "pump_house.toml"
    path.write_text(prefix + TINY, encoding="utf-8")
    return str(path)


def test_schedule_csv_folder_twice(run, tmp_path):
    out = tmp_path / "schedule_csv"
    project = tiny_project(tmp_path)
    assert run("schedule", project, "--format", "csv", "-o", str(out)) == (0, "", "")
    first = {p.name: p.read_text() for p in out.iterdir()}
    assert {"lines.csv", "schedule.csv", "totals.csv"} <= set(first)
    assert "H-1" in first["lines.csv"]
    (out / "lines.csv").write_text("edited\n")
    assert run("schedule", project, "--format", "csv", "-o", str(out)) == (0, "", "")
    assert {p.name: p.read_text() for p in out.iterdir()} == first
    assert temporaries(tmp_path) == []


def test_folder_targets_that_are_refused(run, tmp_path):
    a_file = tmp_path / "plain"
    a_file.write_text("mine\n")
    assert run("schedule", tiny_project(tmp_path), "--format", "csv", "-o", str(a_file)) == (
        2, "", f"Error: --output: {a_file} is a file, not a folder; give a folder for the CSV files\n")
    out = tmp_path / "out"
    (out / "lines.csv").mkdir(parents=True)
    (out / "schedule.csv").write_text("old\n")
    with pytest.raises(InputError) as info:
        fileio.write_folder(str(out), CSV)
    assert str(info.value) == (f"--output: {out}/lines.csv is a folder; pipeins replaces only a folder of its own "
                               "CSV files: give a new or empty folder")
    assert (out / "schedule.csv").read_text() == "old\n" and (out / "lines.csv").is_dir()
    (out / "lines.csv").rmdir()
    (out / "notes.txt").write_text("mine\n")
    with pytest.raises(InputError) as info:
        fileio.write_folder(str(out), CSV)
    assert str(info.value) == f"--output: {out} holds notes.txt, which pipeins did not write; give a new or empty folder"
    assert a_file.read_text() == "mine\n" and (out / "notes.txt").exists()
    assert temporaries(tmp_path) == []


def test_current_folder_refused(tmp_path, monkeypatch):
    monkeypatch.chdir(tmp_path)
    with pytest.raises(InputError) as info:
        fileio.write_folder(".", CSV)
    assert str(info.value) == "--output: . is the current folder; give a new folder for the CSV files"


@pytest.mark.parametrize("where, code", [("os.mkdir", errno.EROFS), ("write", errno.ENOSPC), ("os.open", errno.EACCES)])
def test_folder_os_errors_one_line_old_folder_intact(tmp_path, monkeypatch, where, code):
    out = tmp_path / "out"
    out.mkdir()
    (out / "lines.csv").write_text("old\n")
    calls = []

    def fail_second(*args, **kw):  # the second file fails: part of the new folder exists
        if where == "os.open" and not str(args[0]).endswith(".csv"):
            return real(*args, **kw)  # shutil.rmtree's own calls
        calls.append(1)
        if len(calls) >= (1 if where == "os.mkdir" else 2):
            raise OSError(code, os.strerror(code))
        return real(*args, **kw)

    if where == "write":
        real = fileio._write_fd
        monkeypatch.setattr(fileio, "_write_fd", fail_second)
    else:
        real = getattr(os, where.split(".")[1])
        monkeypatch.setattr(os, where.split(".")[1], fail_second)
    with pytest.raises(InputError) as info:
        fileio.write_folder(str(out), CSV)
    assert str(info.value) == f"--output: cannot write {out}: {os.strerror(code)}"
    monkeypatch.undo()
    assert {p.name: p.read_text() for p in out.iterdir()} == {"lines.csv": "old\n"}
    assert temporaries(tmp_path) == []


RACE = """
import os, sys, time
from pipeins import fileio
from pipeins.errors import InputError
me, target, go, exchange = sys.argv[1:5]
if exchange == "no":
    fileio._renameat2 = lambda src, dst, flags: False
while not os.path.exists(go):
    time.sleep(0.001)
try:
    fileio.write_folder(target, {f"{n}.csv": f"run {me}\\n" * 2000 for n in "abcdef"})
except InputError as exc:
    print(f"Error: {exc}")
    sys.exit(2)
"""


@pytest.mark.parametrize("exchange", ["yes", "no"], ids=["renameat2", "two-renames"])
@pytest.mark.parametrize("exists", [False, True], ids=["new-folder", "existing-folder"])
def test_racing_runs_give_one_complete_folder(tmp_path, exchange, exists):
    out, go = tmp_path / "out", tmp_path / "go"
    if exists:
        out.mkdir()
        (out / "a.csv").write_text("old\n")
    procs = [subprocess.Popen([sys.executable, "-c", RACE, str(i), str(out), str(go), exchange], cwd=ROOT,
                              stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True,
                              env={**os.environ, "PYTHONPATH": str(ROOT)}) for i in range(4)]
    time.sleep(0.5)
    go.write_text("")
    results = [(p.wait(60), p.stdout.read(), p.stderr.read()) for p in procs]
    for code, stdout, stderr in results:
        assert stderr == ""
        assert code == 0 or (code == 2 and stdout.count("\n") == 1 and stdout.startswith("Error: --output: ")), stdout
    assert any(code == 0 for code, _, _ in results)
    contents = {p.read_text() for p in out.iterdir()}
    assert sorted(p.name for p in out.iterdir()) == [f"{n}.csv" for n in "abcdef"]
    assert len(contents) == 1  # every file from the same run: never a mix
    assert [p.name for p in tmp_path.iterdir() if p.name.startswith(".pipeins-")] == []


# -- input files ---------------------------------------------------------------------------

def copy_example(tmp_path, prefix=b""):
    for name in ("hospital_steam.toml", "costs_demo.csv"):
        (tmp_path / name).write_bytes(prefix + (ROOT / "examples" / name).read_bytes())
    return tmp_path / "hospital_steam.toml"


def test_bom_files_read_fine(run, tmp_path):
    """A byte-order mark (as some editors on Windows write) on a project and on a cost table."""
    plain = run("schedule", tiny_project(tmp_path))
    assert plain[0] == 0
    assert run("schedule", tiny_project(tmp_path, "\ufeff")) == plain
    from pipeins.economics import CostTable

    demo = ROOT / "examples" / "costs_demo.csv"
    bom = tmp_path / "costs.csv"
    bom.write_bytes(b"\xef\xbb\xbf" + demo.read_bytes())
    assert CostTable.from_csv(bom)._costs == CostTable.from_csv(demo)._costs


def test_project_not_utf8(run, tmp_path):
    path = tmp_path / "x.toml"
    path.write_bytes(b"\xff")
    assert run("schedule", str(path)) == (
        2, "", f"Error: PROJECT: {path}: not UTF-8 text (byte 0xff at offset 0); save it as UTF-8\n")


def test_cost_table_not_utf8(run, tmp_path):
    project = copy_example(tmp_path)
    text = (tmp_path / "costs_demo.csv").read_bytes()
    offset = text.index(b"NPS 4")
    (tmp_path / "costs_demo.csv").write_bytes(text[:offset] + b"NPS\xa04" + text[offset + 5:])
    code, out, err = run("schedule", str(project))
    assert (code, out) == (2, "")
    line = next(n for n, row in enumerate((tmp_path / "hospital_steam.toml").read_text().splitlines(), 1)
                if row.startswith("cost_table"))
    assert err.splitlines()[0] == (f"Error: hospital_steam.toml: line {line} (project): cost_table: "
                                   f"{tmp_path}/costs_demo.csv: not UTF-8 text (byte 0xa0 at offset {offset + 3}); "
                                   "save it as UTF-8")
    assert all(row.startswith("Error: hospital_steam.toml: line ") for row in err.splitlines())
    path = tmp_path / "costs_demo.csv"
    assert run("cost", "--pipe", "NPS 4", "--fluid-temp", "82C", "--layer", "mineral wool:50mm", "--hours", "5000h",
               "--energy-price", "0.09/kWh", "--efficiency", "0.88", "--cost-table", str(path)) == (
        2, "", f"Error: --cost-table: {path}: not UTF-8 text (byte 0xa0 at offset {offset + 3}); save it as UTF-8\n")


def test_code_table_not_utf8(run, tmp_path):
    path = tmp_path / "rules.csv"
    path.write_bytes(b"rule_set,temp_c\n\xe9t\xe9\n")
    assert run("size", "--pipe", "NPS 2", "--fluid-temp", "80C", "--material", "mineral wool",
               "--code", "ashrae-90.1-2019", "--code-table", str(path)) == (
        2, "", f"Error: --code-table: {path}: not UTF-8 text (byte 0xe9 at offset 16); save it as UTF-8\n")


def test_deeply_nested_inline_table(run, tmp_path):
    path = tmp_path / "deep.toml"
    path.write_text('[project]\nname = "deep"\nx = ' + "{a = " * 500 + "1" + "}" * 500 + "\n")
    assert run("schedule", str(path)) == (
        2, "", "Error: deep.toml: line 3: tables and arrays nested deeper than 32 levels\n")
    path.write_text('[project]\nname = "deep"\nx = ' + "[" * 600 + "]" * 600 + "\n")
    assert run("schedule", str(path))[2] == "Error: deep.toml: line 3: tables and arrays nested deeper than 32 levels\n"


def test_toml_depth_skips_strings_and_comments():
    text = 'a = "[[[[{{{{"\nb = \'[[[[\'\nc = """\n' + "[" * 100 + '\n"""\n# ' + "{" * 100 + "\nd = [[1], [2]]\n"
    assert fileio.toml_depth_problem(text) is None
    assert fileio.load_toml(text, "t.toml")["d"] == [[1], [2]]
    nested = "x = " + "[" * 32 + "]" * 32
    assert fileio.toml_depth_problem(nested) is None  # 32 levels is the limit, allowed
    assert fileio.toml_depth_problem("x = " + "[" * 33 + "]" * 33) == 1


def test_nul_byte_in_a_path(run, tmp_path):
    path = tmp_path / "nul.toml"
    path.write_text('[project]\nname = "nul"\ncost_table = "\\u0000"\ncode_tables = ["a\\u0000b"]\n')
    code, out, err = run("schedule", str(path))
    assert (code, out) == (2, "")
    assert "Error: nul.toml: line 3 (project): cost_table: the file name contains a NUL byte\n" in err
    assert "Error: nul.toml: line 4 (project): code_tables: the file name contains a NUL byte\n" in err
    with pytest.raises(InputError) as info:
        fileio.read_text_input("a\x00b", "--cost-table")
    assert str(info.value) == "--cost-table: a\\x00b: the file name contains a NUL byte"
    with pytest.raises(InputError) as info:
        fileio.write_text_output("a\x00b", "x")
    assert str(info.value) == "--output: cannot write a\\x00b: the file name contains a NUL byte"


@pytest.mark.parametrize("content, why", [
    (b"size\x00\n", "not a text file (a NUL byte at offset 4)"),
    (b"\xff\xfes\x00", "is UTF-16 text; save it as UTF-8"),
    (b"ok \xc3", "not UTF-8 text (byte 0xc3 at offset 3); save it as UTF-8"),
    (b"\xef\xbb\xbfok \xc3(", "not UTF-8 text (byte 0xc3 at offset 6); save it as UTF-8"),
])
def test_binary_input_files(tmp_path, content, why):
    path = tmp_path / "t.csv"
    path.write_bytes(content)
    with pytest.raises(InputError) as info:
        fileio.read_text_input(path, "--cost-table")
    assert str(info.value) == f"--cost-table: {path}: {why}"


def test_input_folder_missing_and_too_large(tmp_path, monkeypatch):
    for path, why in [(tmp_path, "is a folder, not a file"), (tmp_path / "none.csv", "no such file")]:
        with pytest.raises(InputError) as info:
            fileio.read_text_input(path, "--cost-table")
        assert str(info.value) == f"--cost-table: {path}: {why}"
    big = tmp_path / "big.csv"
    big.write_bytes(b"x" * 2000)
    monkeypatch.setattr(fileio, "MAX_INPUT_BYTES", 1024 * 1024)
    assert fileio.read_text_input(big, "--cost-table") == "x" * 2000
    monkeypatch.setattr(fileio, "MAX_INPUT_BYTES", 1999)
    with pytest.raises(InputError) as info:
        fileio.read_text_input(big, "--cost-table")
    assert str(info.value) == f"--cost-table: {big}: is larger than 1999 bytes, the limit for an input file"


def test_input_from_a_pipe(tmp_path):
    """``--cost-table <(generate)`` hands a pipe: read like a file."""
    fifo = tmp_path / "p"
    os.mkfifo(fifo)
    writer = threading.Thread(target=lambda: fifo.write_bytes(b"\xef\xbb\xbfsize\n"))
    writer.start()
    assert fileio.read_text_input(fifo, "--cost-table") == "size\n"
    writer.join(10)


def test_output_folder_and_name_clash_one_line_via_the_cli(run, tmp_path):
    assert run(*CHECK, "-o", str(tmp_path)) == (
        2, "", f"Error: --output: {tmp_path} is a folder, not a file; give a file path or - for standard output\n")
    a_file = tmp_path / "plain"
    a_file.write_text("mine\n")
    assert run(*CHECK, "-o", f"{a_file}/report.txt") == (
        2, "", f"Error: --output: cannot write {a_file}/report.txt: {a_file} is not a folder\n")
    with pytest.raises(InputError) as info:
        fileio.write_folder(f"{a_file}/csv", CSV)
    assert str(info.value) == f"--output: cannot write {a_file}/csv: {a_file} is not a folder"
    assert a_file.read_text() == "mine\n"


def test_bytes_output_for_binary_formats(tmp_path, umask, capfdbinary):
    umask(0o022)
    target = tmp_path / "book.bin"
    fileio.write_bytes_output(str(target), b"\x00\xffbinary")
    assert target.read_bytes() == b"\x00\xffbinary"
    assert stat.S_IMODE(target.stat().st_mode) == 0o644
    fileio.write_bytes_output("-", b"\x00raw")
    assert capfdbinary.readouterr().out == b"\x00raw"


@settings(max_examples=150, deadline=None)
@given(st.binary(max_size=300))
def test_any_bytes_read_as_text_or_one_line_error(tmp_path_factory, data):
    path = tmp_path_factory.mktemp("fuzz") / "x.toml"
    path.write_bytes(data)
    try:
        text = fileio.read_text_input(path, "PROJECT")
    except InputError as exc:
        assert "\n" not in str(exc) and str(exc).startswith(f"PROJECT: {path}: ")
        return
    assert "\x00" not in text and not text.startswith("\ufeff")


@settings(max_examples=150, deadline=None)
@given(st.lists(st.sampled_from(["[", "]", "{", "}", "a = ", "1", ",", '"', "\n", "#", "'"]), max_size=400))
def test_any_bracket_soup_parses_or_fails_cleanly(tokens):
    import tomllib

    text = "".join(tokens)
    try:
        fileio.load_toml(text, "soup.toml")
    except (InputError, tomllib.TOMLDecodeError) as exc:
        assert "\n" not in str(exc)
    levels = len(tokens) * 3 + 1
    deep = "x = " + "[" * levels + "]" * levels
    try:
        assert fileio.load_toml(deep, "deep.toml")["x"] is not None and levels <= fileio.MAX_TOML_DEPTH
    except InputError as exc:
        assert str(exc) == "deep.toml: line 1: tables and arrays nested deeper than 32 levels"
