"""The SHA-256 the record prints of the session file's bytes and of its own canonical numbers
(core/record_values.py). Check values: the published SHA-256 examples of FIPS 180-2 (appendix B.1, "abc",
and the empty message), and Python's hashlib over UTF-8 text."""

import hashlib

from core.record_values import numbers_sha256, sha256_of_bytes

ABC = "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"       # FIPS 180-2, B.1
EMPTY = "e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855"     # SHA-256 of no bytes


def test_the_session_files_bytes_hash_as_published():
    assert sha256_of_bytes(b"abc") == ABC
    assert sha256_of_bytes(b"") == EMPTY


def test_the_numbers_hash_their_utf8_canonical_spelling():
    numbers = {"unit": "µrad", "values": ["-0.5", "2"]}
    spelled = '{"unit":"µrad","values":["-0.5","2"]}'
    assert numbers_sha256(numbers) == hashlib.sha256(spelled.encode("utf-8")).hexdigest()
