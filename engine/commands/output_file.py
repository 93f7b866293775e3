"""Writing a command's output file so that a failure never destroys the one already there."""

from __future__ import annotations

import os
import secrets

from ..section.errors import InputError


def write_text(path: str, text: str, field: str = "out") -> None:
    """Write `text` (UTF-8) to `path` through a temporary file in the same folder.

    The new file is complete before it takes the old one's name (`os.replace`
    is atomic within one file system), so an error half way, a full disk or an
    interrupted run leaves the file that was there untouched. Raises an
    `InputError` naming `field` when the file cannot be written.
    """
    try:
        data = text.encode("utf-8")
    except UnicodeEncodeError as error:  # a lone surrogate: a fault upstream, refused whole
        raise InputError(field, path, "a file whose text can be written as UTF-8",
                         why=f"character {error.start + 1} is not text") from None
    folder = os.path.dirname(path) or "."
    temporary = os.path.join(folder, f".{os.path.basename(path)}.{secrets.token_hex(4)}.tmp")
    try:
        # 0o666 less the umask, the mode an ordinary open() gives a new file.
        descriptor = os.open(temporary, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o666)
        try:
            with os.fdopen(descriptor, "wb") as file:
                file.write(data)
            os.replace(temporary, path)
        except BaseException:
            try:
                os.unlink(temporary)
            except OSError:
                pass
            raise
    except OSError as error:
        raise InputError(field, path, "a file that can be written",
                         why=error.strerror or str(error)) from None
    except (ValueError, UnicodeError):  # a NUL in the name, or a name no file system holds
        raise InputError(field, path, "a file name", why="not a possible file name") from None
