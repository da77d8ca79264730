import fontkit from "@pdf-lib/fontkit";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { dirname, join } from "node:path";
import { describe, expect, it } from "vitest";
import { woffToSfnt } from "~/review/pdf/woff-sfnt.server";

const require = createRequire(import.meta.url);
const file = join(dirname(require.resolve("@fontsource/dejavu-sans/package.json")), "files", "dejavu-sans-latin-400-normal.woff");

// fontkit's own WOFF reader is the reference: the unwrapped sfnt must describe the same font.
describe("WOFF to sfnt", () => {
  it("gives the font fontkit reads from the WOFF itself", () => {
    const woff = readFileSync(file);
    const fromWoff = fontkit.create(woff);
    const sfnt = woffToSfnt(woff);
    expect(sfnt.readUInt32BE(0)).toBe(0x00010000); // TrueType flavour, per the OpenType spec
    const fromSfnt = fontkit.create(sfnt);
    expect(fromSfnt.numGlyphs).toBe(fromWoff.numGlyphs);
    expect(fromSfnt.postscriptName).toBe(fromWoff.postscriptName);
    for (const ch of "aνηΩ≤²₀") {
      const cp = ch.codePointAt(0)!;
      expect(fromSfnt.hasGlyphForCodePoint(cp), ch).toBe(true);
      expect(fromSfnt.glyphForCodePoint(cp).advanceWidth, ch).toBe(fromWoff.glyphForCodePoint(cp).advanceWidth);
    }
  });

  it("refuses what is not a WOFF 1.0 font, saying why", () => {
    expect(() => woffToSfnt(Buffer.from("not a font at all, just some text here to pass the length"))).toThrow(/Not a WOFF 1.0 font/);
    const woff = readFileSync(file);
    expect(() => woffToSfnt(woff.subarray(0, 200))).toThrow(/runs past the end|damaged/);
  });
});
