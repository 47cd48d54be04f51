export { colors } from './colors';
export type { ColorName } from './colors';
export { fonts, fontFiles, fontSize, lineHeight } from './typography';
export { space, radius, WIDE_MIN_WIDTH, TOUCH_MIN } from './spacing';
