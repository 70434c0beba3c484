"""Reading the user's input files and writing output, without surprises.

Every file pipeins reads from the user (project file, cost table, code table) goes
through :func:`read_text_input`: UTF-8 text with or without a byte-order mark, at most
:data:`MAX_INPUT_BYTES`, no NUL bytes; anything else is one :class:`InputError` naming
the input and the file.  :func:`load_toml` parses TOML text, refusing nesting deeper
than :data:`MAX_TOML_DEPTH`.

Output goes through :func:`write_text_output` (one file) or :func:`write_folder` (a
folder of files, swapped in whole).  Nothing is written half-way: a regular file is
replaced atomically (temporary sibling, fsync, rename), a folder is built complete
beside the old one and exchanged with it.  New files get ``0o666 & ~umask`` and new
folders ``0o777 & ~umask``; a file or folder that exists keeps its mode.  Every
``OSError`` becomes ``InputError(what, "cannot write PATH: reason")``; temporaries are
removed on every error path and on SIGINT/SIGTERM, and temporaries left by a killed
run (named ``.pipeins-<name>-<pid>-<random>.tmp``) are removed by the next write into
the same folder.
"""

from __future__ import annotations

import contextlib
import errno
import os
import re
import signal
import stat
import sys
import threading
import time

from .errors import InputError

__all__ = ["MAX_INPUT_BYTES", "MAX_TOML_DEPTH", "read_text_input", "load_toml", "input_path_problem",
           "write_text_output", "write_bytes_output", "write_folder"]

MAX_INPUT_BYTES = 20 * 1024 * 1024
"""Largest input file read [bytes] (20 MiB): far above any real project or table."""

MAX_TOML_DEPTH = 32
"""Deepest nesting of inline tables and arrays accepted in a TOML file."""

STALE_AFTER_S = 60.0
"""A temporary of a run whose process still exists is stale after this age [s]."""

_TEMP = re.compile(r"^\.pipeins-(?P<name>.*)-(?P<pid>\d+)-[0-9a-f]{12}\.(?P<kind>tmp|old)$")
_NAME_KEPT = 100  # characters of the target's name kept in a temporary's name


def _shown(path) -> str:
    """A path as text for a one-line message: control characters escaped."""
    text = os.fsdecode(path) if isinstance(path, bytes) else str(path)
    return "".join(c if c.isprintable() else ascii(c)[1:-1] for c in text)


def _reason(exc: OSError) -> str:
    return exc.strerror or str(exc)


# -- input ---------------------------------------------------------------------------------

def _too_large() -> str:
    limit = f"{MAX_INPUT_BYTES / 2**20:g} MB" if MAX_INPUT_BYTES >= 2**20 else f"{MAX_INPUT_BYTES} bytes"
    return f"is larger than {limit}, the limit for an input file"


def input_path_problem(path) -> str | None:
    """Why *path* cannot be read as an input file (a short phrase), or None if it can.

    >>> input_path_problem("a\\x00b")
    'the file name contains a NUL byte'
    """
    text = os.fsdecode(path) if isinstance(path, bytes) else str(path)
    if "\x00" in text:
        return "the file name contains a NUL byte"
    try:
        st = os.stat(text)
    except FileNotFoundError:
        return "no such file"
    except OSError as exc:
        return f"cannot read it: {_reason(exc)}"
    if stat.S_ISDIR(st.st_mode):
        return "is a folder, not a file"
    if not (stat.S_ISREG(st.st_mode) or stat.S_ISFIFO(st.st_mode)):
        return "is a device, not a file"
    if stat.S_ISREG(st.st_mode) and st.st_size > MAX_INPUT_BYTES:
        return _too_large()
    return None


def read_text_input(path, what: str) -> str:
    """The text of the input file *path*, read as UTF-8 (a leading byte-order mark dropped).

    Parameters
    ----------
    path : str or os.PathLike
        The file, as the user wrote it (it is named so in errors); a pipe is fine.
    what : str
        The input's name for errors: a flag (``--cost-table``) or ``PROJECT``.

    Raises
    ------
    InputError
        One line, ``<what>: <path>: <why>``, when the name holds a NUL byte, the path is
        missing, a folder or a device, the file exceeds :data:`MAX_INPUT_BYTES`, holds a
        NUL byte, or is not UTF-8 (the first bad byte and its offset are named).
    """
    shown = _shown(path)
    problem = input_path_problem(path)
    if problem:
        raise InputError(what, f"{shown}: {problem}")
    try:
        with open(os.fspath(path), "rb") as fh:
            data = fh.read(MAX_INPUT_BYTES + 1)
    except OSError as exc:
        raise InputError(what, f"{shown}: cannot read it: {_reason(exc)}") from None
    if len(data) > MAX_INPUT_BYTES:
        raise InputError(what, f"{shown}: {_too_large()}")
    if data.startswith((b"\xff\xfe", b"\xfe\xff")):
        raise InputError(what, f"{shown}: is UTF-16 text; save it as UTF-8")
    bom = 3 if data.startswith(b"\xef\xbb\xbf") else 0
    nul = data.find(b"\x00")
    if nul >= 0:
        raise InputError(what, f"{shown}: not a text file (a NUL byte at offset {nul})")
    try:
        return data[bom:].decode("utf-8")
    except UnicodeDecodeError as exc:
        offset = bom + exc.start
        raise InputError(what, f"{shown}: not UTF-8 text (byte 0x{data[offset]:02x} at offset {offset}); "
                               "save it as UTF-8") from None


_TOML_TOKEN = re.compile(r'"""(?:[^\\]|\\.)*?"""|\'\'\'.*?\'\'\'|"(?:[^"\\\n]|\\.)*"|\'[^\'\n]*\'|#[^\n]*|[\[\]{}]',
                         re.DOTALL)


def toml_depth_problem(text: str) -> int | None:
    """The line where the nesting of ``[``/``{`` in TOML *text* first passes
    :data:`MAX_TOML_DEPTH`, or None (strings and comments are skipped).

    >>> toml_depth_problem("a = " + "[" * 40 + "]" * 40)
    1
    >>> toml_depth_problem('a = "' + "[" * 40 + '"') is None
    True
    """
    depth = 0
    for m in _TOML_TOKEN.finditer(text):  # strings and comments are tokens too: skipped whole
        token = m.group()
        if token in "[{":
            depth += 1
            if depth > MAX_TOML_DEPTH:
                return 1 + text.count("\n", 0, m.start())  # the line it is on
        elif token in "]}":
            depth = max(depth - 1, 0)
    return None


def load_toml(text: str, source: str) -> dict:
    """``tomllib.loads(text)``, refusing nesting deeper than :data:`MAX_TOML_DEPTH`.

    Raises ``tomllib.TOMLDecodeError`` for invalid TOML, and ``InputError`` (one line,
    starting with *source*, the file name) for nesting too deep to be a project.
    """
    import tomllib

    line = toml_depth_problem(text)
    too_deep = f"tables and arrays nested deeper than {MAX_TOML_DEPTH} levels"
    if line is not None:
        raise InputError("", f"{source}: line {line}: {too_deep}")
    try:
        return tomllib.loads(text)
    except RecursionError:
        raise InputError("", f"{source}: {too_deep}") from None


# -- output: shared parts --------------------------------------------------------------------

def _umask() -> int:
    try:
        with open("/proc/self/status", encoding="ascii") as fh:
            for row in fh:
                if row.startswith("Umask:"):
                    return int(row.split()[1], 8)
    except (OSError, ValueError, IndexError):
        pass
    mask = os.umask(0o22)  # no other way to read it; set back at once
    os.umask(mask)
    return mask


class _Signalled(BaseException):
    def __init__(self, signum):
        super().__init__(signum)
        self.signum = signum


@contextlib.contextmanager
def _signals_abort():
    """While the block runs, SIGINT and SIGTERM abort it (so its cleanup runs); the
    signal is then delivered again under the handler that was there before."""
    if threading.current_thread() is not threading.main_thread():
        yield
        return

    def handler(signum, frame):
        raise _Signalled(signum)

    saved = {}
    for sig in (signal.SIGINT, signal.SIGTERM):
        old = signal.getsignal(sig)
        if old is not signal.SIG_IGN and old is not None:
            saved[sig] = signal.signal(sig, handler)
    try:
        yield
    except _Signalled as exc:
        for sig, old in saved.items():
            signal.signal(sig, old)
        saved = {}
        signal.raise_signal(exc.signum)
        raise KeyboardInterrupt from None  # the old handler let it pass: stop anyway, cleaned up
    finally:
        for sig, old in saved.items():
            signal.signal(sig, old)


def _pid_alive(pid: int) -> bool:
    if pid == os.getpid():
        return True
    try:
        os.kill(pid, 0)
    except ProcessLookupError:
        return False
    except OSError:
        return True
    return True


def _temp_name(target_name: str, kind: str = "tmp") -> str:
    return f".pipeins-{target_name[:_NAME_KEPT]}-{os.getpid()}-{os.urandom(6).hex()}.{kind}"


def clean_stale(folder: str) -> None:
    """Remove the temporaries that killed runs left in *folder*: those whose process is
    gone, or older than :data:`STALE_AFTER_S`.  A folder set aside by a run killed
    between its two renames is put back when its place is still empty."""
    import shutil

    now = time.time()
    try:
        entries = list(os.scandir(folder))
    except OSError:
        return
    for entry in entries:
        m = _TEMP.match(entry.name)
        if not m:
            continue
        try:
            age = now - entry.stat(follow_symlinks=False).st_mtime
        except OSError:
            continue
        if _pid_alive(int(m["pid"])) and age < STALE_AFTER_S:
            continue
        try:
            if entry.is_dir(follow_symlinks=False):
                home = os.path.join(folder, m["name"])
                if m["kind"] == "old" and len(m["name"]) < _NAME_KEPT and not os.path.lexists(home):
                    os.rename(entry.path, home)
                else:
                    shutil.rmtree(entry.path, ignore_errors=True)
            else:
                os.unlink(entry.path)
        except OSError:
            pass


def _no_folder(folder: str) -> str:
    if os.path.lexists(folder):
        return f"{_shown(folder)} is not a folder"
    return f"the folder {_shown(folder)} does not exist"


def _fsync_folder(folder: str) -> None:
    try:
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(fd)
    except OSError:
        pass
    finally:
        os.close(fd)


_O_NOCTTY = getattr(os, "O_NOCTTY", 0)
_O_BINARY = getattr(os, "O_BINARY", 0)  # Windows: no newline translation


def _chmod(fd: int, path: str, mode: int) -> None:
    if hasattr(os, "fchmod"):
        os.fchmod(fd, mode)
    else:  # Windows keeps only the read-only bit
        os.chmod(path, mode)


def _write_fd(fd: int, data) -> None:
    for block in _blocks(data):
        view = memoryview(block)
        while view:
            view = view[os.write(fd, view):]


def _blocks(data, size: int = 1 << 20):
    """*data* (bytes, or a list of bytes pieces) in blocks of about *size* bytes: a long
    document's pieces are written without first joining them into one copy."""
    if isinstance(data, (bytes, bytearray, memoryview)):
        yield data
        return
    batch, held = [], 0
    for piece in data:
        batch.append(piece)
        held += len(piece)
        if held >= size:
            yield b"".join(batch)
            batch, held = [], 0
    if batch:
        yield b"".join(batch)


# -- output: one file ---------------------------------------------------------------------

_TTY_MAJORS = {4, 5, *range(136, 144)}  # Linux: tty*, ttyS*, /dev/tty and console, pts/*


def _is_terminal(st: os.stat_result, path: str) -> bool:
    """True when the character device *st* is a terminal, found without opening it for writing."""
    for fd in (0, 1, 2):
        try:
            if os.path.samestat(st, os.fstat(fd)):
                return os.isatty(fd)
        except OSError:
            continue
    if sys.platform.startswith("linux"):
        return os.major(st.st_rdev) in _TTY_MAJORS
    try:
        fd = os.open(path, os.O_RDONLY | _O_NOCTTY | getattr(os, "O_NONBLOCK", 0))
    except OSError:
        return False
    try:
        return os.isatty(fd)
    finally:
        os.close(fd)


def _std_stream_fd(st: os.stat_result) -> int | None:
    for fd in (1, 2):
        try:
            if os.path.samestat(st, os.fstat(fd)):
                return fd
        except OSError:
            continue
    return None


def write_text_output(path, text: str, what: str = "--output") -> None:
    """Write *text* (UTF-8) to *path*, whole or not at all.

    ``-`` is standard output.  A regular file, a missing path or a symlink's target is
    replaced atomically; a named pipe, a terminal or this process's standard output or
    error is written straight; any other device, a socket or a folder is refused before
    anything is opened for writing.

    Raises
    ------
    InputError
        ``<what>: PATH is a device, not a file; …`` (or a folder, a socket), or
        ``<what>: cannot write PATH: reason`` for any OS error.
    """
    if isinstance(text, bytes):  # a binary format (xlsx, png) handed as bytes
        write_bytes_output(path, text, what)
        return
    if os.fspath(path) == "-":
        sys.stdout.write(text)
        sys.stdout.flush()
        return
    write_bytes_output(path, text.encode("utf-8", "backslashreplace"), what)


def write_bytes_output(path, data, what: str = "--output") -> None:
    """Write *data* to *path* as :func:`write_text_output` writes text (``-`` is the
    binary standard output).  *data* is bytes, or a list of bytes pieces written in turn
    (all of them made before anything is written, so nothing goes out half-way)."""
    if os.fspath(path) == "-":
        binary = getattr(sys.stdout, "buffer", None)
        if binary is None:
            raise InputError(what, "this standard output takes text only; give a file path")
        sys.stdout.flush()
        for block in _blocks(data):
            binary.write(block)
        binary.flush()
        return
    shown = _shown(path)
    path = os.fspath(path)
    if "\x00" in path:
        raise InputError(what, f"cannot write {shown}: the file name contains a NUL byte")
    try:
        st = os.stat(path)
    except (FileNotFoundError, NotADirectoryError):
        st = None
    except OSError as exc:
        raise InputError(what, f"cannot write {shown}: {_reason(exc)}") from None
    hint = "give a file path or - for standard output"
    if st is None or stat.S_ISREG(st.st_mode):
        if st is not None and not os.access(path, os.W_OK):
            raise InputError(what, f"cannot write {shown}: {os.strerror(errno.EACCES)}")
        std = _std_stream_fd(st) if st is not None else None
        if std is not None:  # e.g. -o /dev/stdout with stdout redirected to a file
            sys.stdout.flush()
            sys.stderr.flush()
            _straight_to_fd(std, data, what, shown)
            return
        _atomic_file(os.path.realpath(path), data, None if st is None else stat.S_IMODE(st.st_mode), what, shown)
    elif stat.S_ISFIFO(st.st_mode) or (stat.S_ISCHR(st.st_mode) and _is_terminal(st, path)):
        std = _std_stream_fd(st)
        if std is not None:
            sys.stdout.flush()
            sys.stderr.flush()
            _straight_to_fd(std, data, what, shown)
            return
        try:
            fd = os.open(path, os.O_WRONLY | _O_NOCTTY)
        except OSError as exc:
            raise InputError(what, f"cannot write {shown}: {_reason(exc)}") from None
        try:
            _straight_to_fd(fd, data, what, shown)
        finally:
            os.close(fd)
    elif stat.S_ISDIR(st.st_mode):
        raise InputError(what, f"{shown} is a folder, not a file; {hint}")
    elif stat.S_ISSOCK(st.st_mode):
        raise InputError(what, f"{shown} is a socket, not a file; {hint}")
    else:
        raise InputError(what, f"{shown} is a device, not a file; {hint}")


def _straight_to_fd(fd: int, data: bytes, what: str, shown: str) -> None:
    try:
        _write_fd(fd, data)
    except BrokenPipeError:
        raise InputError(what, f"cannot write {shown}: the reader closed the pipe") from None
    except OSError as exc:
        raise InputError(what, f"cannot write {shown}: {_reason(exc)}") from None


def _atomic_file(real: str, data: bytes, mode: int | None, what: str, shown: str) -> None:
    folder, name = os.path.split(real)
    folder = folder or "."
    if not os.path.isdir(folder):
        raise InputError(what, f"cannot write {shown}: {_no_folder(folder)}")
    clean_stale(folder)
    tmp = os.path.join(folder, _temp_name(name))
    fd = None
    try:
        with _signals_abort():
            try:
                fd = os.open(tmp, os.O_WRONLY | os.O_CREAT | os.O_EXCL | _O_BINARY, 0o600)
                _chmod(fd, tmp, (0o666 & ~_umask()) if mode is None else mode)
                _write_fd(fd, data)
                os.fsync(fd)
                os.close(fd)
                fd = None
                os.replace(tmp, real)
                tmp = None
            finally:
                if fd is not None:
                    os.close(fd)
                if tmp is not None:
                    with contextlib.suppress(OSError):
                        os.unlink(tmp)
    except OSError as exc:
        raise InputError(what, f"cannot write {shown}: {_reason(exc)}") from None
    _fsync_folder(folder)


# -- output: a folder of files ------------------------------------------------------------

RENAME_NOREPLACE, RENAME_EXCHANGE = 1, 2


def _renameat2(src: str, dst: str, flags: int) -> bool:
    """Linux renameat2(2): True when done, False when the system cannot (then rename by
    hand); other errors raise OSError."""
    if not sys.platform.startswith("linux"):
        return False
    import ctypes

    try:
        libc = ctypes.CDLL(None, use_errno=True)
        func = libc.renameat2
    except (OSError, AttributeError):
        return False
    at_fdcwd = -100
    if func(at_fdcwd, os.fsencode(src), at_fdcwd, os.fsencode(dst), flags) == 0:
        return True
    code = ctypes.get_errno()
    if code in (errno.ENOSYS, errno.EINVAL, errno.ENOTSUP):
        return False
    raise OSError(code, os.strerror(code), dst)


def _check_replaceable(target: str, shown: str, what: str) -> None:
    """An existing folder is replaced whole only when it holds nothing but regular
    ``.csv`` files (what pipeins writes there): nothing else of the user's is lost."""
    with os.scandir(target) as entries:
        for entry in entries:
            if entry.is_dir(follow_symlinks=False):
                raise InputError(what, f"{_shown(os.path.join(shown, entry.name))} is a folder; pipeins replaces "
                                       "only a folder of its own CSV files: give a new or empty folder")
            if not (entry.is_file(follow_symlinks=False) and entry.name.endswith(".csv")):
                raise InputError(what, f"{shown} holds {_shown(entry.name)}, which pipeins did not write; "
                                       "give a new or empty folder")


def write_folder(path, files: dict[str, str], what: str = "--output") -> None:
    """Write the folder *path* holding exactly *files* (name -> UTF-8 text), swapped in whole.

    The new folder is built complete in a temporary sibling, then exchanged with the old
    one (renameat2 where the system has it, else two renames, undone by the next run if
    killed between them) and the old one removed: a reader sees the old folder or the
    new one, never a mix.  An existing *path* must be a folder holding only ``.csv``
    files; a regular file, a subfolder or any other file in it is refused.  Two runs
    racing for the same folder each end with a complete folder or a clean error.

    Raises
    ------
    InputError
        One line for a refused target or any OS error (``cannot write PATH: reason``).
    """
    shown = _shown(path)
    path = os.fspath(path)
    if "\x00" in path:
        raise InputError(what, f"cannot write {shown}: the file name contains a NUL byte")
    target = os.path.realpath(path)
    parent, name = os.path.split(target)
    if not name:
        raise InputError(what, f"cannot write {shown}: give a folder below the root")
    with contextlib.suppress(OSError):
        here = os.getcwd()
        if here == target or here.startswith(target + os.sep):
            where = "is" if here == target else "holds"
            raise InputError(what, f"{shown} {where} the current folder; give a new folder for the CSV files")
    if os.path.lexists(target) and not os.path.isdir(target):
        raise InputError(what, f"{shown} is a file, not a folder; give a folder for the CSV files")
    if not os.path.isdir(parent):
        raise InputError(what, f"cannot write {shown}: {_no_folder(parent)}")
    for file_name in files:
        if os.sep in file_name or file_name in ("", ".", ".."):
            raise ValueError(f"not a plain file name: {file_name!r}")
    try:
        clean_stale(parent)
        with _signals_abort():
            _swap_in(parent, name, target, files, shown, what)
    except OSError as exc:
        raise InputError(what, f"cannot write {shown}: {_reason(exc)}") from None
    _fsync_folder(parent)


def _swap_in(parent, name, target, files, shown, what):
    import shutil

    umask = _umask()
    new = os.path.join(parent, _temp_name(name))
    os.mkdir(new, 0o700)
    aside = None  # the old folder, once set aside by hand
    try:
        for file_name, text in files.items():
            fd = os.open(os.path.join(new, file_name), os.O_WRONLY | os.O_CREAT | os.O_EXCL | _O_BINARY, 0o600)
            try:
                _chmod(fd, os.path.join(new, file_name), 0o666 & ~umask)
                _write_fd(fd, text.encode("utf-8", "backslashreplace"))
                os.fsync(fd)
            finally:
                os.close(fd)
        _fsync_folder(new)
        for _attempt in range(5):
            try:
                st = os.stat(target)
            except FileNotFoundError:
                os.chmod(new, 0o777 & ~umask)
                try:
                    if not _renameat2(new, target, RENAME_NOREPLACE):
                        os.rename(new, target)  # fails on a folder that is not empty
                except OSError as exc:
                    if exc.errno in (errno.EEXIST, errno.ENOTEMPTY):
                        continue  # another run came first: swap with its folder
                    raise
                new = None
                return
            if not stat.S_ISDIR(st.st_mode):
                raise InputError(what, f"{shown} is a file, not a folder; give a folder for the CSV files")
            _check_replaceable(target, shown, what)
            os.chmod(new, stat.S_IMODE(st.st_mode))
            if _renameat2(new, target, RENAME_EXCHANGE):
                pass  # *new* now names the old folder
            else:
                aside = os.path.join(parent, _temp_name(name, "old"))
                try:
                    os.rename(target, aside)
                except FileNotFoundError:
                    aside = None
                    continue  # another run moved it: try again
                try:
                    os.rename(new, target)
                except OSError as exc:
                    if exc.errno in (errno.EEXIST, errno.ENOTEMPTY):
                        shutil.rmtree(aside, ignore_errors=True)  # another run's folder is in place
                        aside = None
                        continue
                    raise
                new, aside = aside, None
            return
        raise InputError(what, f"cannot write {shown}: other runs kept writing it at the same time; run again")
    finally:
        if aside is not None and not os.path.lexists(target):
            with contextlib.suppress(OSError):
                os.rename(aside, target)  # put the old folder back
                aside = None
        for leftover in (new, aside):
            if leftover is not None:
                shutil.rmtree(leftover, ignore_errors=True)
