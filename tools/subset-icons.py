"""Cuts Material Symbols down to the given ligature names (see tools/subset-icons.sh).

A ligature name maps to a glyph through GSUB (some names are aliases: remove_circle_outline draws
do_not_disturb_on), so the glyphs to keep are looked up there. The font is pinned to its default
axes (weight 400, no fill, grade 0, optical size 24: what mat-icon uses) and subset with
--no-layout-closure, so the letters that spell the names do not pull every other icon back in.
"""
import sys

from fontTools import subset
from fontTools.ttLib import TTFont
from fontTools.varLib import instancer

source, names_file, target = sys.argv[1:4]
names = [line.strip() for line in open(names_file, encoding='utf-8') if line.strip()]
font = TTFont(source)

spelled = {glyph: chr(code) for code, glyph in font.getBestCmap().items()}
ligatures = {}
for lookup in font['GSUB'].table.LookupList.Lookup:
    for table in lookup.SubTable:
        table = getattr(table, 'ExtSubTable', table)
        if getattr(table, 'LookupType', None) != 4:
            continue
        for first, entries in table.ligatures.items():
            for entry in entries:
                try:
                    text = spelled[first] + ''.join(spelled[g] for g in entry.Component)
                except KeyError:
                    continue
                ligatures.setdefault(text, entry.LigGlyph)

missing = [name for name in names if name not in ligatures]
if missing:
    sys.exit('no such icon in Material Symbols: ' + ', '.join(missing))

font = instancer.instantiateVariableFont(font, {axis.axisTag: None for axis in font['fvar'].axes})
options = subset.Options()
options.layout_closure = False
options.layout_features = ['liga', 'rlig', 'rclt']
options.hinting = False
options.flavor = 'woff2'
options.name_IDs = ['*']
subsetter = subset.Subsetter(options)
subsetter.populate(
    glyphs=sorted({ligatures[name] for name in names}),
    text=' 0123456789_abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ',
)
subsetter.subset(font)
font.save(target)
print(f'{len(names)} icons, {len(font.getGlyphOrder())} glyphs, written to {target}')
