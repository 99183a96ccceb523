#!/usr/bin/env python3
"""Writes the seed corpora of the fuzz targets added for issue 12 from the
test fixtures: tests/fuzz/corpus/{selector,robots,extract,mail}/.

Sources: the fixture job board (tests/fixtures/listing/server.py: its pages
and robots.txt), the RFC 9309 section 5.1 example of
tests/collector/robots_test.cpp, the selectors and field rules of the
extraction tests and docs/fetch.md, and the mail fixtures
(tests/fixtures/mail: IMAP messages, Maildir files, the mbox). Every name in
them is invented. Re-run after changing a fixture:
    python3 tests/fuzz/make_seeds.py
"""
import importlib.util
import os
import shutil

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))
CORPUS = os.path.join(ROOT, "tests", "fuzz", "corpus")


def board():
    spec = importlib.util.spec_from_file_location("board", os.path.join(ROOT, "tests/fixtures/listing/server.py"))
    mod = importlib.util.module_from_spec(spec)
    spec.loader.exec_module(mod)
    return mod


def write(target, name, data):
    os.makedirs(os.path.join(CORPUS, target), exist_ok=True)
    if isinstance(data, str):
        data = data.encode("utf-8")
    with open(os.path.join(CORPUS, target, name), "wb") as f:
        f.write(data)


def main():
    b = board()
    for target in ("selector", "robots", "extract", "mail"):
        shutil.rmtree(os.path.join(CORPUS, target), ignore_errors=True)

    selectors = ["ol#results", "li.candidate", "h3.name", "a.profile @href", "@data-candidate", ".salary",
                 "ol", "div > p", "li[data-k=b] span.name", "x-card[lang='vm']", "ol.ranked > li.item.top",
                 "* [data-candidate] > a", "[ data-x = \"a b\" ]", "li.", "#", "a >", "a[b", "a[b=\"c]", ""]
    for i, s in enumerate(selectors):
        write("selector", f"rule{i:02d}.txt", s)

    write("robots", "board.txt", b.ROBOTS)
    write("robots", "rfc9309_5_1.txt",
          "User-Agent: *\nDisallow: *.gif$\nDisallow: /example/\nAllow: /publications/\n\n"
          "User-Agent: foobot\nDisallow:/\nAllow:/example/page.html\nAllow:/example/allowed.gif\n\n"
          "User-Agent: barbot\nUser-Agent: bazbot\nDisallow: /example/page.html\n\n"
          "User-Agent: quxbot\n\nEOF\n")
    write("robots", "encoded.txt",
          "\ufeffuser-agent: FooBot/1.0 extra\r\nallow: /%7Efoo/%2a\r\ndisallow: /a%3cd$\r\n"
          "Disallow: /path/\u30c4\r\nsitemap: https://board.example/map.xml\r\n")

    seed = "/search?q=nurse"
    write("extract", "listing.html", b.listing(seed, count=4))
    write("extract", "missing_field.html", b.listing(seed, count=3, missing_name_at=2))
    write("extract", "empty.html", b.page("Candidates", '<ol id="results" class="ranked"></ol><p>No candidates.</p>'))
    write("extract", "broken.html", b.page("Maintenance", "<p>The board is being repaired.</p>"))
    write("extract", "latin1.html", b.listing(seed, count=2).replace("Veldmark", "V\u00e9ldmark").encode("latin-1"))
    write("extract", "repaired.html",
          "<ol id=results><li class=candidate data-candidate=vjx-1><h3 class=name>Aldo <b>Brenvik"
          "<li class=candidate data-candidate=vjx-2><h3 class=name>Ilse<script>x()</script> Valtasz</h3>"
          "<a class=profile href=/c/vjx-2 title=t>Profile</a><template><p>t</p></template></ol>")

    mail = os.path.join(ROOT, "tests", "fixtures", "mail")
    for name in sorted(os.listdir(os.path.join(mail, "imap"))):
        with open(os.path.join(mail, "imap", name), "rb") as f:
            write("mail", "imap_" + name, f.read())
    for sub in ("new", "cur"):
        folder = os.path.join(mail, "study", "mail", "Maildir", sub)
        for i, name in enumerate(sorted(os.listdir(folder))):
            with open(os.path.join(folder, name), "rb") as f:
                write("mail", f"maildir_{sub}_{i}.eml", f.read())
    with open(os.path.join(mail, "study", "mail", "inbox.mbox"), "rb") as f:
        write("mail", "inbox.mbox", f.read())


if __name__ == "__main__":
    main()
