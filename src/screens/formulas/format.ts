/** Number formatting for the formula screens: fixed decimals so columns line up. */
export const money = (value: number | null | undefined, places = 2) => (value === null || value === undefined ? '—' : value.toFixed(places));
export const pct = (value: number | null | undefined, places = 2) => (value === null || value === undefined ? '—' : value.toFixed(places));
export const kg = (value: number | null | undefined) => (value === null || value === undefined ? '—' : value >= 100 ? value.toFixed(1) : value.toFixed(2));
export const signed = (value: number, places = 2) => `${value > 0 ? '+' : value < 0 ? '−' : '±'}${Math.abs(value).toFixed(places)}`;
export const when = (iso: string | null) => (iso ? new Date(iso).toISOString().slice(0, 16).replace('T', ' ') + ' UTC' : '');
