// Average advance of a sans-serif glyph as a fraction of the font size; digits and lower case
// letters sit near 0.55, capitals and Ω/µ a little wider. Good enough to reserve margins.
const AVERAGE_ADVANCE = 0.58;

/** Estimated width in pixels of a line of text, used to reserve margins and place labels. */
export function textWidth(text: string, fontSize: number): number {
  return [...text].length * AVERAGE_ADVANCE * fontSize;
}
