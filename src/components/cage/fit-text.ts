/**
 * Labels that stay inside their slot. SVG text does not wrap or clip, so a label longer than its
 * slot runs into the next slot or under a finding's badge. Without a layout engine on the server
 * we estimate a label's width from its length and size (a generous average advance for the
 * sans-serif faces the drawing uses) and take the first of several wordings that fits.
 */

/** Average advance of a character, as a share of the font size (regular and bold sans-serif). */
const ADVANCE = { regular: 0.6, bold: 0.66 } as const;

/** The estimated width of `text` at `fontSize`, in drawing units (errs on the wide side). */
export function textWidth(text: string, fontSize: number, weight: keyof typeof ADVANCE = 'regular'): number {
  return [...text].length * fontSize * ADVANCE[weight];
}

/**
 * The first wording that fits `maxWidth`; if none does, the last one cut short with an ellipsis
 * (the slot's accessible name keeps the full words).
 */
export function fitLabel(
  candidates: readonly string[],
  maxWidth: number,
  fontSize: number,
  weight: keyof typeof ADVANCE = 'regular',
): string {
  const words = candidates.filter((c) => c.length > 0);
  for (const c of words) if (textWidth(c, fontSize, weight) <= maxWidth) return c;
  const last = words[words.length - 1] ?? '';
  const room = Math.max(0, Math.floor(maxWidth / (fontSize * ADVANCE[weight])) - 1);
  return room > 0 ? `${[...last].slice(0, room).join('')}…` : '';
}
