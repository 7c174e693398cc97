# Reads the CMake cache of the build under test (helper for script tests; not a test itself).
import os


def cache_value(name):
    """The value of cache entry `name` in the build that made WHITTLE_BIN, or None."""
    build = os.path.dirname(os.path.abspath(os.environ["WHITTLE_BIN"]))
    try:
        with open(os.path.join(build, "CMakeCache.txt")) as f:
            for line in f:
                if line.startswith(name + ":"):
                    return line.split("=", 1)[1].strip()
    except OSError:
        pass
    return None


def is_on(name):
    return (cache_value(name) or "").upper() in ("ON", "TRUE", "1", "YES")
