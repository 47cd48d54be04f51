/**
 * Font families as registered with expo-font in app/_layout.tsx, and the type scale.
 * Text uses Atkinson Hyperlegible Next (legible on small screens in poor light);
 * numbers use IBM Plex Mono so columns of figures line up (every digit has the same width).
 */
export const fontFiles = {
  'TextRegular': require('../../fonts/AtkinsonHyperlegibleNext_400Regular.ttf'),
  'TextSemiBold': require('../../fonts/AtkinsonHyperlegibleNext_600SemiBold.ttf'),
  'TextBold': require('../../fonts/AtkinsonHyperlegibleNext_700Bold.ttf'),
  'FiguresRegular': require('../../fonts/IBMPlexMono_400Regular.ttf'),
  'FiguresSemiBold': require('../../fonts/IBMPlexMono_600SemiBold.ttf'),
} as const;

export const fonts = {
  text: 'TextRegular',
  textSemiBold: 'TextSemiBold',
  textBold: 'TextBold',
  figures: 'FiguresRegular',
  figuresSemiBold: 'FiguresSemiBold',
} as const;

/** Type scale in px, a 1.2 ratio from a 16 px body (readable on a 360 px phone without zoom). */
export const fontSize = {
  caption: 13,
  small: 14,
  body: 16,
  lead: 19,
  title: 23,
  display: 28,
} as const;

export const lineHeight = {
  caption: 18,
  small: 20,
  body: 24,
  lead: 27,
  title: 30,
  display: 36,
} as const;
