# The user's guide holds together: every relative link in README.md, DEVELOPERS.md and docs/*.md names an
# existing file, README links every docs/*.md page, and README stays a guide (at most 250 lines).
import os
import re
import sys

SRC = os.environ["WHITTLE_SOURCE_DIR"]
LINK = re.compile(r"\[[^\]]*\]\(([^)\s]+)\)")
MAX_README_LINES = 250

failed = 0


def fail(msg):
    global failed
    failed += 1
    print(f"FAIL {msg}")


def links(path):
    """(line number, target) of every relative link outside code blocks and code spans."""
    out, fenced = [], False
    for n, line in enumerate(open(path, encoding="utf-8"), 1):
        if line.lstrip().startswith("```"):
            fenced = not fenced
            continue
        if fenced:
            continue
        for m in LINK.finditer(re.sub(r"`[^`]*`", "", line)):
            target = m.group(1)
            if re.match(r"^[a-z][a-z0-9+.-]*:", target) or target.startswith("#"):
                continue  # a URL or an anchor in the same page
            out.append((n, target.split("#", 1)[0]))
    return out


def main():
    docs = sorted(f for f in os.listdir(os.path.join(SRC, "docs")) if f.endswith(".md"))
    pages = ["README.md", "DEVELOPERS.md"] + [os.path.join("docs", f) for f in docs]
    checked = 0
    for page in pages:
        path = os.path.join(SRC, page)
        for n, target in links(path):
            checked += 1
            if not os.path.exists(os.path.normpath(os.path.join(os.path.dirname(path), target))):
                fail(f"{page}:{n}: link to '{target}', which does not exist")
    readme = os.path.join(SRC, "README.md")
    linked = {os.path.normpath(t) for _, t in links(readme)}
    for f in docs:
        if os.path.join("docs", f) not in linked:
            fail(f"README.md does not link docs/{f}")
    lines = sum(1 for _ in open(readme, encoding="utf-8"))
    if lines > MAX_README_LINES:
        fail(f"README.md has {lines} lines; it is the user's guide (at most {MAX_README_LINES}): move reference text into docs/")
    print(f"{checked} links in {len(pages)} pages checked, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
