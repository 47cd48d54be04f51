/** Number formatting and field paths for messages (kept plain: the engine runs on the phone too). */
import type { FieldError } from '../schemas/formulation';

/** Round to `digits` significant digits and drop trailing zeros: 22.8, 0.0123, 3200. */
export function fmt(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 10 ** digits) return String(Math.round(v));
  const s = Number(v.toPrecision(digits));
  return String(Object.is(s, -0) ? 0 : s);
}

/** Money with two decimals. */
export function money(v: number): string {
  return (Math.round(v * 100) / 100).toFixed(2);
}

/** `v unit` with a space, or just `v` when there is no unit. */
export function withUnit(v: number, unit?: string): string {
  return unit ? `${fmt(v)} ${unit}` : fmt(v);
}

/** A zod-style path as a person reads it: `ratios[2].numerator`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const part of path) {
    if (typeof part === 'number') out += `[${part}]`;
    else out += out ? `.${String(part)}` : String(part);
  }
  return out || '(input)';
}

/** Map zod issues to field errors. */
export function fieldErrors(issues: readonly { path: readonly PropertyKey[]; message: string }[]): FieldError[] {
  return issues.map((i) => ({ field: formatPath(i.path), message: i.message }));
}

/** Round tiny noise (|v| < eps) to 0 for reporting. */
export function clean(v: number, eps = 1e-12): number {
  return Math.abs(v) < eps ? 0 : v;
}
