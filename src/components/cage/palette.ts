/**
 * Colours of the drawing. They mirror the Tailwind tokens in tailwind.config.mjs (steel, iris,
 * fit, crop, advice) as plain values, so the SVG looks the same wherever it is rendered — in the
 * editor island, on a server-rendered share page, on a print sheet — without depending on
 * utility classes being present. Colour never carries meaning alone: every severity also has an
 * outline style, an icon shape and words.
 */
import type { Severity } from '~/lib/domain/schemas';
import { severityWords } from '~/lib/domain/vocabulary';

export const INK = '#1c2430';
export const INK_SOFT = '#3d4a5c';
export const INK_MUTED = '#5f6b7c';

export const STEEL = {
  50: '#f5f7f9',
  100: '#e9edf1',
  200: '#d3dae2',
  300: '#b3bfcb',
  400: '#8c9bab',
  500: '#6b7b8d',
  600: '#536273',
  700: '#414d5b',
  800: '#2e3742',
  900: '#1d242c',
} as const;

export const IRIS = { 100: '#e8e1fb', 300: '#b39cef', 500: '#7851d6', 700: '#51319a' } as const;

export interface SeverityStyle {
  /** Words shown beside the icon and read by screen readers. */
  words: string;
  colour: string;
  soft: string;
  /** Outline dash pattern: solid for fit, dashes for the crop, dots for advice. */
  dash: string | undefined;
  strokeWidth: number;
  rank: number;
}

export const SEVERITY_STYLE: Record<Severity, SeverityStyle> = {
  'blocks-fit': { words: severityWords('blocks-fit'), colour: '#b3261e', soft: '#fde8e6', dash: undefined, strokeWidth: 3.5, rank: 0 },
  'hurts-crop': { words: severityWords('hurts-crop'), colour: '#a35200', soft: '#fff1df', dash: '7 4', strokeWidth: 3, rank: 1 },
  advice: { words: severityWords('advice'), colour: '#1f5fa8', soft: '#e6f0fb', dash: '2 4', strokeWidth: 3, rank: 2 },
};

export const CHANGED_COLOUR = IRIS[700];
