/**
 * E-mail colours: the app's palette (client/src/styles/index.css) in sRGB hex, approximated from
 * its oklch values, because mail clients do not read oklch or CSS variables.
 */
export const MAIL_COLOURS = {
  paper: '#faf9f6',
  panel: '#ffffff',
  rule: '#e4e2dc',
  ink500: '#7d7b76',
  ink700: '#4f4d48',
  ink900: '#2b2a26',
  accent500: '#2e7d74',
  accent50: '#eef7f5',
  caution: '#a87a1c',
  caution50: '#fbf5e6',
  serious: '#a8402f',
  serious50: '#fbeeeb',
} as const;
