"""Test ids in plain ASCII with no backslash.

pytest escapes a non-ASCII character or a newline in an id (π -> \\u03c0); collected a second time in the same
process (as the mutation run does: once to time the tests, again to run them) the escape is escaped again, the
id no longer names a test and the run stops. An id made plain here is the same on every collection."""


def plain_id(text):
    """'π/6' -> 'U+03C0/6', a newline -> ' | ', a backslash -> 'U+005C'; the empty text -> '<empty>'."""
    if not text:
        return "<empty>"
    out = []
    for character in text.replace("\r\n", "\n"):
        if character == "\n":
            out.append(" | ")
        elif character == "\\" or not (" " <= character <= "~"):
            out.append(f"U+{ord(character):04X}")
        else:
            out.append(character)
    return "".join(out)
