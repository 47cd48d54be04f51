/** Spacing steps in px (a 4 px grid) and the layout breakpoint. */
export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;

export const radius = { sm: 4, md: 8, lg: 14 } as const;

/** At this width and above the app switches from bottom tabs to a side rail and multi-column layouts. */
export const WIDE_MIN_WIDTH = 1024;

/** Minimum touch target (px), comfortable for a gloved or hurried thumb. */
export const TOUCH_MIN = 48;
