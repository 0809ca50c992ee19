"""The errors Kinepoly raises: every one names the place it is about.

Nothing else escapes the public functions of :mod:`kinematics`; a caller
that catches :class:`KinematicsError` has caught every refusal.
"""


class KinematicsError(Exception):
    """Base of every refusal. ``location`` names the place (a file path and
    line, a JSON path such as ``links.coupler[2]``, a joint, link or step)."""

    def __init__(self, message: str, location: str = ""):
        self.location = location
        self.detail = message
        super().__init__(f"{location}: {message}" if location else message)


class FileFormatError(KinematicsError):
    """A mechanism file that is not well-formed.

    ``kind`` names the rule it breaks:

    - ``"text"``: not JSON text, or (a document given as Python objects) not JSON data;
    - ``"version"``: the ``kinepoly`` format version is missing, not a whole number, or newer;
    - ``"structure"``: the JSON Schema of the format (keys, types, names, limits);
    - ``"reference"``: what no schema can say of names: one that must exist does not, two
      differ only in case, a driver pivot off ground, a slide line not fixed in its guide;
    - ``"geometry"``: the reference pose: coincident points, a slide point off its line.
    """

    KINDS = ("text", "version", "structure", "reference", "geometry")

    def __init__(self, message: str, location: str = "", kind: str = "structure"):
        self.kind = kind
        super().__init__(message, location)


class MechanismFindings(KinematicsError):
    """A well-formed mechanism that cannot be analysed yet (no driver,
    wrong mobility, a redundant link ...). ``findings`` lists them all."""

    def __init__(self, findings):
        self.findings = tuple(findings)
        first = self.findings[0]
        more = f" (and {len(self.findings) - 1} more)" if len(self.findings) > 1 else ""
        super().__init__(first.message + more, first.location)


class CannotAssemble(KinematicsError):
    """No pose of the linkage exists at the asked driver angle."""


class ParallelLines(KinematicsError):
    """Two construction lines that should intersect are parallel."""


class StorageError(KinematicsError):
    """A file that could not be written; nothing at the target was changed."""


class SweepCancelled(KinematicsError):
    """The ``progress`` callback of :func:`kinematics.sweep` asked to stop."""


class ProtectedFile(StorageError):
    """The target is read-only, or another user's: it is replaced only when the user agrees
    (``overwrite_protected=True``). ``reason`` says which, for a question to the user."""

    def __init__(self, reason: str, location: str = ""):
        self.reason = reason
        super().__init__(f"{reason}, so it was left as it was", location)


class NoMassData(KinematicsError):
    """Forces were asked of a design with no masses and no loads: there is nothing to compute them from."""


class ForcesUndetermined(KinematicsError):
    """Joint forces that statics does not determine (a redundant link, a locked pose):
    refused rather than guessed by least squares."""
