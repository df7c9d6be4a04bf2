"""Plain Python ports that produced the expected values of
tests/base/hashing_test.cc (run with /usr/bin/python3; prints them).

- FNV-1a, 64 bits: offset basis 14695981039346656037 (0xcbf29ce484222325),
  prime 1099511628211 (Fowler, Noll & Vo; IETF draft-eastlake-fnv). The
  values for "", "a" and "foobar" also appear in the FNV reference test
  suite (test_fnv.c of the FNV reference code, www.isthe.com/chongo/tech/comp/fnv).
- SplitMix64: a line-by-line port of splitmix64.c by Sebastiano Vigna
  (prng.di.unimi.it, public domain): x += 0x9e3779b97f4a7c15, then the
  two xor-shift-multiply rounds and a final xor-shift.
"""

MASK = (1 << 64) - 1


def fnv1a64(data: bytes) -> int:
    h = 14695981039346656037
    for byte in data:
        h ^= byte
        h = (h * 1099511628211) & MASK
    return h


def splitmix64(seed: int, count: int) -> list:
    x, out = seed, []
    for _ in range(count):
        x = (x + 0x9E3779B97F4A7C15) & MASK
        z = x
        z = ((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9) & MASK
        z = ((z ^ (z >> 27)) * 0x94D049BB133111EB) & MASK
        out.append(z ^ (z >> 31))
    return out


if __name__ == "__main__":
    for text in (b"", b"a", b"foobar"):
        print("FNV-1a 64", text, hex(fnv1a64(text)))
    for seed in (0, 1234567):
        print("SplitMix64 seed", seed, [hex(v) for v in splitmix64(seed, 3)])
