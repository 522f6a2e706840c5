/**
 * Long unbroken words cut to the line width before pdfkit wraps them. pdfkit's line wrapper splits
 * a word wider than the line one line at a time and measures the whole rest of the word again for
 * each line, so its cost grows with the square of the word's length (a 20 000-character customer
 * name took 6.7 s and 844 MB). Cut here, each piece is measured once: the cost is linear in the
 * text, and the lines break where pdfkit would have broken them (at the last character that fits).
 * Text without such words comes back unchanged.
 */

/** A word longer than this many characters is checked against the width (no glyph is narrower than a tenth of the font size, and no line is wider than 1000 pt). */
const SHORT_WORD = 24;

/**
 * Cut every word of `text` wider than `width` into pieces that fit, separated by line breaks.
 * `widthOf` measures a string in the current font (points). Linear in the text's length: each
 * character is measured once (widths of single characters are cached).
 */
export function breakLongWords(text: string, width: number, widthOf: (s: string) => number): string {
  if (!(width > 0) || !/\S{25}/.test(text)) return text;
  const charWidth = new Map<string, number>();
  const cw = (ch: string) => {
    let w = charWidth.get(ch);
    if (w === undefined) {
      w = widthOf(ch);
      charWidth.set(ch, w);
    }
    return w;
  };
  return text.replace(/\S+/g, (word) => {
    if (word.length <= SHORT_WORD) return word;
    const pieces: string[] = [];
    let start = 0;
    let used = 0;
    // by code point, so a character outside the BMP is never cut in half
    let i = 0;
    for (const ch of word) {
      const w = cw(ch);
      if (used + w > width && i > start) {
        pieces.push(word.slice(start, i));
        start = i;
        used = 0;
      }
      used += w;
      i += ch.length;
    }
    pieces.push(word.slice(start));
    return pieces.length === 1 ? word : pieces.join("\n");
  });
}
