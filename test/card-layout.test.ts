/** The card's pure helpers: tally grouping from the layout file, the WOFF unpacker, brush angles, axis ticks. */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { createRequire } from "node:module";
import { cardLayout, layoutProblems, pageBreaks, tallyBoxes, tallyGroups } from "../src/card/layout.js";
import { FONT_FILES, SHAPING_TABLES, UNPACKED_DIR, cardFonts, unpackFont, woffToSfnt } from "../src/card/fonts.js";
import { ticksFromZero as niceTicks } from "../src/plot/ticks.js";
import { needsFourWire } from "../src/card/pages/bench.js";
import { Sheet } from "../src/card/sheet.js";
import { readBoxes, readRules, ruleProblems } from "./helpers/pdf-layout.js";

const L = cardLayout();

describe("tally boxes", () => {
  it("the shipped layout file is usable", () => {
    expect(layoutProblems(L)).toEqual([]);
  });
  it("one rule for every count: 5 turns a box up to 60 turns, 10 turns a box above (issue 11)", () => {
    expect(tallyBoxes(3, L.tally).boxes.map((b) => b.upTo)).toEqual([3]);
    expect(tallyBoxes(13, L.tally).boxes.map((b) => b.upTo)).toEqual([5, 10, 13]);
    expect(tallyBoxes(30, L.tally).step).toBe(5);
    expect(tallyBoxes(60, L.tally).boxes).toHaveLength(12);
    const t64 = tallyBoxes(64, L.tally);
    expect(t64.step).toBe(10);
    expect(t64.boxes.map((b) => b.upTo)).toEqual([10, 20, 30, 40, 50, 60, 64]);
    expect(t64.boxes[6].turns).toBe(4);
    for (let n = 1; n <= 2000; n++) expect([5, 10]).toContain(tallyBoxes(n, L.tally).step);
  });
  it("for any turn count: boxes add up to the turns, counts rise to it, at most max_boxes when a step allows", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20000 }), (n) => {
        const { step, boxes } = tallyBoxes(n, L.tally);
        expect(boxes.reduce((a, b) => a + b.turns, 0)).toBe(n);
        expect(boxes[boxes.length - 1].upTo).toBe(n);
        boxes.forEach((b, i) => {
          expect(b.turns).toBeGreaterThan(0);
          expect(b.turns).toBeLessThanOrEqual(step);
          if (i < boxes.length - 1) expect(b.turns).toBe(step);
        });
        const largest = L.tally.turns_per_box[L.tally.turns_per_box.length - 1];
        if (Math.ceil(n / largest) <= L.tally.max_boxes) expect(boxes.length).toBeLessThanOrEqual(L.tally.max_boxes);
        const groups = tallyGroups(boxes, L.tally.group_size);
        expect(groups.flat()).toEqual(boxes);
        expect(groups.every((g) => g.length <= L.tally.group_size)).toBe(true);
      }),
    );
  });
});

describe("fonts", () => {
  it("unpacks the DejaVu WOFF into an sfnt that keeps every table (W3C WOFF 1.0)", () => {
    const woff = readFileSync(FONT_FILES.regular);
    const sfnt = woffToSfnt(woff);
    const n = woff.readUInt16BE(12);
    expect(sfnt.readUInt16BE(4)).toBe(n);
    expect(sfnt.readUInt32BE(0)).toBe(woff.readUInt32BE(4)); // flavour
    expect(sfnt.length).toBe(woff.readUInt32BE(16)); // totalSfntSize in the WOFF header
    // fontkit reads it and finds the glyphs the card needs
    const fontkit = createRequire(import.meta.url)("fontkit");
    const font = fontkit.create(sfnt);
    for (const ch of "Ω°±²×−→") expect(font.hasGlyphForCodePoint(ch.codePointAt(0)!)).toBe(true);
  });
  it("the card's fonts leave out the OpenType shaping tables and still carry every glyph it prints", () => {
    const fontkit = createRequire(import.meta.url)("fontkit");
    for (const buf of Object.values(cardFonts())) {
      const font = fontkit.create(buf);
      for (const t of SHAPING_TABLES) expect(font.directory.tables[t], t).toBeUndefined();
      for (const ch of "Ω°±²×−→") expect(font.hasGlyphForCodePoint(ch.codePointAt(0)!)).toBe(true);
      expect(font.layout("Ω 1.57").glyphs.length).toBe(6);
    }
  });
  it("the fonts the build unpacked, when there are any, are what unpacking gives now (else rebuild: npm run build)", () => {
    const fresh = { regular: unpackFont("regular"), bold: unpackFont("bold") };
    const got = cardFonts();
    expect(got.regular.equals(fresh.regular)).toBe(true);
    expect(got.bold.equals(fresh.bold)).toBe(true);
    for (const f of existsSync(UNPACKED_DIR) ? readdirSync(UNPACKED_DIR) : []) {
      const weight = f.split("-")[0] as "regular" | "bold";
      expect(readFileSync(join(UNPACKED_DIR, f)).equals(fresh[weight]), f).toBe(true);
    }
  });
  it("the card's fonts name no glyphs ('post' 3.0) and keep the 'post' header the card reads (OpenType spec, 'post')", () => {
    const fontkit = createRequire(import.meta.url)("fontkit");
    for (const file of Object.values(FONT_FILES)) {
      const full = fontkit.create(woffToSfnt(readFileSync(file), SHAPING_TABLES));
      const card = fontkit.create(woffToSfnt(readFileSync(file), SHAPING_TABLES, { glyphNames: false }));
      expect(full.post.version).toBe(2);
      expect(card.post.version).toBe(3);
      for (const k of ["italicAngle", "underlinePosition", "underlineThickness", "isFixedPitch"]) expect(card.post[k], k).toEqual(full.post[k]);
      expect(card.italicAngle).toBe(full.italicAngle);
      expect(card.postscriptName).toBe(full.postscriptName);
    }
  });
});

describe("small rules", () => {
  it("axis ticks cover the maximum in steps of 1, 2, 2.5 or 5 × 10^n", () => {
    expect(niceTicks(9817)).toEqual([0, 2000, 4000, 6000, 8000, 10000]);
    fc.assert(
      fc.property(fc.double({ min: 1e-4, max: 1e6, noNaN: true }), (m) => {
        const t = niceTicks(m);
        expect(t[0]).toBe(0);
        expect(t[t.length - 1]).toBeGreaterThanOrEqual(m * (1 - 1e-9));
        expect(t.length).toBeLessThanOrEqual(12);
      }),
    );
  });
  it("four-wire advice below forty counts of the meter (bench rules: common practice, no published source)", () => {
    expect(needsFourWire(0.0196, 0.01)).toBe(true);
    expect(needsFourWire(0.399, 0.01)).toBe(true);
    expect(needsFourWire(1.329, 0.01)).toBe(false);
  });
});

describe("text laid out once, drawn as laid out (issue 15 item 2)", () => {
  const INFO = { CreationDate: new Date(0), ModDate: new Date(0) };
  const TEXT =
    "Bar to bar (every pair), terminal resistance, ground, growler, polarity: the bench sheet, sections 1 and 2. Ω ± ° ² — a long_unbroken_word_of_more_than_twenty_five_characters_that_must_be_cut here.";
  it("a block's lines fit its width and its height is pdfkit's heightOfString", () => {
    const s = new Sheet(L, "a4", INFO);
    s.newPage();
    for (const width of [60, 140, 300]) {
      const b = s.layout(TEXT, { size: 9.5, width });
      expect(b.lines.length).toBeGreaterThan(1);
      for (const line of b.lines) expect(s.widthOf(line.text.trimEnd(), { size: 9.5 })).toBeLessThanOrEqual(width + 1e-6);
      expect(
        b.lines
          .map((l) => l.text.trim())
          .join(" ")
          .replace(/\s+/g, ""),
      ).toBe(TEXT.replace(/\s+/g, ""));
      s.font({ size: 9.5 });
      // the same text as pdfkit measures it (cut the same way first)
      const cut = b.lines.map((l) => l.text).join("");
      expect(b.height).toBeCloseTo(s.doc.heightOfString(cut, { width, lineGap: 1 }), 6);
    }
  });
  it("a command on the card never breaks between -- and its option, nor inside a <placeholder> (word joiners)", async () => {
    const { command } = await import("../src/card/text.js");
    const s = new Sheet(L, "a4", INFO);
    s.newPage();
    const text = `Record it with ${command("armwind log <job file> --measured <that file>")} now.`;
    for (let width = 60; width <= 420; width += 3) {
      const lines = s.layout(text, { size: 9.5, width }).lines.map((l) => l.text.replace(/\u2060/g, "").trim());
      for (const l of lines) {
        expect(l, `width ${width}`).not.toMatch(/--$/);
        expect((l.match(/</g) ?? []).length, `width ${width}: ${l}`).toBe((l.match(/>/g) ?? []).length);
      }
      expect(lines.join(" ")).toContain("--measured <that file>");
    }
  });
  it("drawing a laid-out block writes the same page as pdfkit's text() (the two private steps it calls are pdfkit 0.20's)", async () => {
    const draw = async (once: boolean) => {
      const s = new Sheet(L, "a4", INFO);
      s.newPage();
      for (const [i, align] of (["left", "right", "center"] as const).entries()) {
        const style = { size: 9 + i, bold: i === 1, grey: i === 2 ? 0.3 : undefined, width: 200, align };
        // words short enough that nothing is cut first (src/card/wrap.ts), so both draw the same string
        const text = TEXT.replace(/_/g, " ");
        if (once) s.at(text, 50, 80 + i * 150, style);
        else {
          s.font(style);
          s.doc.text(text, 50, 80 + i * 150, { width: 200, align, lineGap: 1 });
        }
      }
      return s.finish();
    };
    const [a, b] = await Promise.all([draw(true), draw(false)]);
    expect(a.equals(b)).toBe(true);
  });
});

describe("the layout check reads rules and boxes from the PDF, and fails on a broken row", () => {
  const INFO = { CreationDate: new Date(0), ModDate: new Date(0) };
  /** Problems found in a one-page sheet drawn by `draw`. */
  const check = async (draw: (s: Sheet) => void) => {
    const s = new Sheet(L, "a4", INFO);
    s.newPage();
    draw(s);
    const pdf = await s.finish();
    const [page] = await readBoxes(pdf);
    const [drawn] = await readRules(pdf);
    return { problems: ruleProblems(page.items, drawn, "page 1"), drawn };
  };
  it("a table whose rows are measured is clean, and its rules and header band are read back where they were drawn", async () => {
    const { problems, drawn } = await check((s) => {
      s.y = 100;
      s.table(
        [
          { head: "coil", width: 60 },
          { head: "slots", width: 120 },
        ],
        [
          ["17", "slot 1 top pos 1 → slot 6 / bottom pos 1, a route long enough to wrap onto three lines"],
          ["18", "slot 2"],
        ],
      );
    });
    expect(problems).toEqual([]);
    expect(drawn.boxes.some((b) => Math.abs(b.x - L.margin.left) < 0.01 && Math.abs(b.top - 100) < 0.01 && Math.abs(b.right - b.x - 180) < 0.01)).toBe(true);
    expect(drawn.rules.filter((r) => Math.abs(r.x0 - L.margin.left) < 0.01 && Math.abs(r.x1 - r.x0 - 180) < 0.01)).toHaveLength(2);
  });
  it("a row whose text runs below its rule fails, naming the text", async () => {
    const { problems } = await check((s) => {
      s.at("slot 1 top pos 1 → slot 6 / bottom pos 1", s.left, 100, { size: 12, width: 120 }); // two lines, to about y 128
      s.y = 118; // the row's rule drawn as if the text took one line
      s.rule();
    });
    expect(problems.join("\n")).toContain('"slot 6 / bottom pos" is crossed by a rule at y 118');
  });
  it("a text that leaves the box it starts in fails", async () => {
    const { problems } = await check((s) => {
      s.y = 100;
      // the body says it used 10 pt; its text takes three lines
      s.framed((x, y, w) => {
        s.at("a note long enough to wrap onto three lines inside a narrow framed box of the card", x, y, { width: w / 4 });
        return 10;
      });
    });
    expect(problems.some((p) => /leaves its box/.test(p))).toBe(true);
  });
});

describe("pageBreaks: blocks kept whole, no block alone on a page when a break can move (issue 11)", () => {
  it("fills the page, then breaks; a last block alone takes one from the page before; a first run of one moves on", () => {
    expect(pageBreaks([100, 100, 100], 1000, 700)).toEqual([]);
    expect(pageBreaks([100, 100, 100, 100], 350, 700)).toEqual([2]); // greedy 3 + 1 → 2 + 2
    expect(pageBreaks([100, 100, 100, 100, 100], 350, 700)).toEqual([3]);
    expect(pageBreaks([100, 100, 100], 150, 700)).toEqual([0]); // one would stand alone: all go on
    expect(pageBreaks([100, 100], 50, 700)).toEqual([0]);
    expect(pageBreaks([400, 400, 400], 800, 800)).toEqual([2]); // the page before would keep one: the last stays alone
  });
  it("for any heights: breaks rise, and every page's blocks fit it unless one block alone is taller than a page", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 5, max: 400 }), { minLength: 1, maxLength: 30 }), fc.integer({ min: 0, max: 700 }), (hs, room) => {
        const full = 700;
        const br = pageBreaks(hs, room, full);
        br.forEach((b, i) => i > 0 && expect(b).toBeGreaterThan(br[i - 1]));
        const starts = [0, ...br.filter((b) => b > 0)];
        const ends = [...br.filter((b) => b > 0), hs.length];
        starts.forEach((st, i) => {
          const sum = hs.slice(st, ends[i]).reduce((a, b) => a + b, 0);
          const cap = i === 0 && br[0] !== 0 ? room : full;
          if (ends[i] - st > 1) expect(sum).toBeLessThanOrEqual(cap);
        });
      }),
    );
  });
});
