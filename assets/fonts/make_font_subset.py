#!/usr/bin/python3
"""Writes assets/fonts/Roboto-Regular-subset.ttf: Roboto Regular cut down to the characters the
app's font atlas loads (kGlyphRanges and kBigGlyphRanges in web/src/theme.cpp, read from there so
that the two lists cannot drift apart). The atlas never holds other characters, so the cut
changes nothing on screen; it takes the font from 306 KB to about 18 KB of the download.
Needs fontTools (Debian: python3-fonttools) and the full font (Debian: fonts-roboto-unhinted).
  python3 assets/fonts/make_font_subset.py [full-font.ttf]"""
import os
import re
import sys

from fontTools import subset

HERE = os.path.dirname(os.path.abspath(__file__))
THEME = os.path.join(HERE, "..", "..", "web", "src", "theme.cpp")
FULL = "/usr/share/fonts/truetype/roboto/unhinted/RobotoTTF/Roboto-Regular.ttf"


def atlas_ranges(source):
    """The (first, last) code point pairs of every ImWchar range list in theme.cpp."""
    pairs = []
    for body in re.findall(r"const ImWchar k\w*GlyphRanges\[\] = \{([^}]*)\}", source):
        numbers = [int(v, 16) for v in re.findall(r"0x([0-9A-Fa-f]+)", body)]
        pairs += list(zip(numbers[0::2], numbers[1::2]))
    if not pairs:
        sys.exit("no glyph ranges found in " + THEME)
    return pairs


def main():
    full = sys.argv[1] if len(sys.argv) > 1 else FULL
    pairs = atlas_ranges(open(THEME, encoding="utf-8").read())
    unicodes = ",".join(f"U+{a:04X}-{b:04X}" for a, b in pairs)
    out = os.path.join(HERE, "Roboto-Regular-subset.ttf")
    # No layout features or hinting: Dear ImGui reads neither (it places glyphs by their advance).
    subset.main([full, "--unicodes=" + unicodes, "--layout-features=", "--no-hinting", "--output-file=" + out])
    print(f"{out}: {os.path.getsize(out)} bytes ({unicodes})")


if __name__ == "__main__":
    main()
