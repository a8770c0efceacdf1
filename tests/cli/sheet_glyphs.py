"""`plumb sheet` and characters that no installed font has (README.md
"plumb sheet": a missing font exits 3, nothing written). Pango draws such
a character as an empty box; the sheet must refuse the text, naming it
and the characters (U+XXXX) and what to install, rather than sign a sheet
that lost an item's name. Names in Chinese, Japanese and Korean print
with the font scripts/deps.sh installs for them (fonts-wqy-microhei),
reached through fontconfig's fallback from the sheet's DejaVu Sans.
Read back with poppler's pdftotext and pdffonts (independent of cairo and
pango, which wrote the PDF); fontconfig's fc-list says which characters
the installed fonts have.
"""
import os
import shutil
import subprocess
import sys
import tempfile

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), "lib"))
from plumbcli import PLUMB, ROOT, check, finish  # noqa: E402

EPOCH = "1767225600"  # 2026-01-01 00:00:00 UTC
# Under the sanitizer build: fontconfig's process-long caches are not leaks
# of ours (tests/lsan.supp says why).
SUPP = "suppressions=" + os.path.join(ROOT, "tests/lsan.supp") + ":print_suppressions=0"
DEJAVU = "/usr/share/fonts/truetype/dejavu"  # where fonts-dejavu-core puts it (scripts/deps.sh)

# Unicode Standard, section 23.5 "Private-Use Characters" (from memory):
# U+E000..U+F8FF and planes 15 and 16 have no standard meaning, so no
# general font draws them. The first that no installed font has (fc-list
# :charset=) is used.
PRIVATE_USE = [0xE000, 0xF8FF, 0xF0001, 0x10FFFD]
# Item names of our own in Chinese (a large torque wrench with a tether
# point), Japanese and Korean; U+626D is the first, 扭 (Unicode Standard, Unihan).
ZH = "扭矩扳手（大型）带安全绳连接点"
JA = "トルクレンチ（大）安全コード付き"
KO = "토크 렌치 (대형) 안전줄 연결점"

tmp = tempfile.mkdtemp(prefix="plumb-sheet-glyphs.", dir=os.environ.get("TMPDIR"))


def tool(*args):
    """(exit status, stdout) of a command; 127 when it is not installed."""
    try:
        r = subprocess.run(list(args), capture_output=True, text=True, timeout=120)
    except FileNotFoundError:
        return 127, ""
    return r.returncode, r.stdout


def run(profile, out, env=None):
    e = dict(os.environ, LC_ALL="C", SOURCE_DATE_EPOCH=EPOCH,
             PLUMB_CRITERIA_DIR=os.path.join(ROOT, "profiles/criteria"),
             LSAN_OPTIONS=SUPP + ":" + os.environ.get("LSAN_OPTIONS", ""))
    if env:
        e.update(env)
    r = subprocess.run([PLUMB, "sheet", profile, "-o", out], capture_output=True, text=True,
                       env=e, timeout=300)
    return r.returncode, r.stdout, r.stderr


def profile(name, items, job=None):
    path = os.path.join(tmp, name + ".yaml")
    with open(path, "w", encoding="utf-8") as f:
        f.write(f"name: {name}\nitems:\n")
        for i, item in enumerate(items):
            f.write(f'  - {{name: "{item}", mass: {2.2 - 0.45 * i:.2f} kg, '
                    f"drag: {{cd: 1.0, area: 0.004 m^2}}}}\n")
        f.write("release: {height: 27 m}\n")
        if job:
            f.write("job: {" + ", ".join(f'{k}: "{v}"' for k, v in job.items()) + "}\n")
    return path


def listing(d):
    return sorted(os.listdir(d))


# ---- a character no installed font has -------------------------------------------
rc, _ = tool("fc-list", "--version")
check(rc == 0, "fc-list (fontconfig) runs: it says which characters the fonts have")
pua = next((c for c in PRIVATE_USE
            if rc == 0 and tool("fc-list", f":charset={c:x}", "family")[1].strip() == ""), None)
check(pua is not None, "a private-use character that no installed font has: "
      + ", ".join(f"U+{c:04X}" for c in PRIVATE_USE) + " all have one")
if pua is not None:
    code = f"U+{pua:04X}"
    # in an item's name: exit 3, the text and the character named, what to
    # do, and the file already there left as it was (written atomically)
    d = os.path.join(tmp, "out1")
    os.mkdir(d)
    out = os.path.join(d, "sheet.pdf")
    with open(out, "wb") as f:
        f.write(b"an earlier sheet\n")
    hook = f"Hook{chr(pua)} 7"
    rc, so, err = run(profile("hook", ["Spanner 19 mm", hook]), out)
    check(rc == 3, f"an item named with {code}: exit {rc} (want 3): {err.strip()!r}")
    check(code in err and hook in err, f"the message names {code} and the text: {err.strip()!r}")
    check("private-use" in err and err.startswith("plumb: "), f"and says what it is: {err!r}")
    check(so == "", f"nothing on standard output: {so!r}")
    with open(out, "rb") as f:
        check(f.read() == b"an earlier sheet\n", "the file already at -o is left as it was")
    check(listing(d) == ["sheet.pdf"], f"no temporary file left beside it: {listing(d)}")
    # in the job's header, not an item: every text on the sheet is checked
    out = os.path.join(d, "header.pdf")
    rc, _, err = run(profile("header", ["Spanner 19 mm"], {"prepared_by": f"Ines{chr(pua)}Ruiz"}),
                     out)
    check(rc == 3 and code in err and "Ines" in err,
          f"a character no font has in prepared_by: exit {rc} (want 3): {err.strip()!r}")
    check(listing(d) == ["sheet.pdf"], f"nothing written for it: {listing(d)}")

# ---- Chinese with only DejaVu (a fontconfig configuration of that one folder) ------
# exit 3 naming U+626D and the CJK font to install, whatever fonts this
# machine has
conf = os.path.join(tmp, "dejavu-only.conf")
with open(conf, "w") as f:
    f.write('<?xml version="1.0"?>\n<!DOCTYPE fontconfig SYSTEM "fonts.dtd">\n'
            f"<fontconfig><dir>{DEJAVU}</dir></fontconfig>\n")
d = os.path.join(tmp, "out2")
os.mkdir(d)
rc, _, err = run(profile("zh-dejavu", [ZH]), os.path.join(d, "zh.pdf"), {"FONTCONFIG_FILE": conf})
check(rc == 3 and "U+626D" in err and ZH[:8] in err,
      f"Chinese with DejaVu alone: exit {rc} (want 3), U+626D and the name in {err.strip()!r}")
check("fonts-wqy-microhei" in err, f"and the font to install named: {err.strip()!r}")
check(listing(d) == [], f"nothing written: {listing(d)}")

# ---- Chinese, Japanese and Korean with the installed fonts ----------------------------
rc, zh_fonts = tool("fc-list", ":lang=zh", "postscriptname")
ps_names = {ln.split("=", 1)[1].strip() for ln in zh_fonts.splitlines() if "=" in ln}
check(bool(ps_names), "a Chinese font is installed (scripts/deps.sh installs fonts-wqy-microhei)")
pdf = os.path.join(tmp, "cjk.pdf")
rc, _, err = run(profile("cjk", [ZH, JA, KO]), pdf)
check(rc == 0 and os.path.exists(pdf), f"names in Chinese, Japanese, Korean: exit {rc}: {err!r}")
if rc == 0:
    rc, text = tool("pdftotext", pdf, "-")
    check(rc == 0, f"pdftotext reads the sheet: exit {rc}")
    for name in (ZH, JA, KO):
        check(name in text, f"{name} whole in the sheet's text")
    rc, fonts = tool("pdffonts", pdf)
    rows = [ln.split() for ln in fonts.splitlines()[2:] if ln.strip()]
    # a row: NAME TYPE... ENCODING EMB SUB UNI ID GEN; a subset's name is
    # TAG+PostScriptName (ISO 32000-1, 9.6.4 "Font Subsets", from memory)
    emb = [r[0].split("+", 1)[-1] for r in rows if len(r) >= 7 and r[-5] == "yes"]
    embedded = set(emb)
    check(rc == 0 and rows and len(emb) == len(rows), f"every font embedded: {fonts!r}")
    check(embedded & ps_names, f"a Chinese font embedded ({sorted(ps_names)}): {sorted(embedded)}")
    check("DejaVuSans" in embedded, f"the rest still in DejaVu Sans: {sorted(embedded)}")

shutil.rmtree(tmp)
finish()
