import assert from 'node:assert/strict';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

import { NUTRIENT_CATALOGUE } from '../../../server/db/reference-data/nutrients';
import type { CatalogueNutrient, LabPreview } from '../../../src/shared/lab-import';

export const FIXTURES = fileURLToPath(new URL('../../fixtures/lab/', import.meta.url));

export const fixture = (name: string) => readFileSync(join(FIXTURES, name), 'utf8');

/** The catalogue the server loads into the database, as the import sees it. */
export const CATALOGUE: CatalogueNutrient[] = NUTRIENT_CATALOGUE.map((n) => ({ id: n.id, name: n.name, unit: n.unit }));

export const close = (actual: number | undefined, expected: number, tolerance: number, what: string) =>
  assert.ok(actual !== undefined && Math.abs(actual - expected) <= tolerance, `${what}: got ${actual}, expected ${expected} ± ${tolerance}`);

export function valueOf(preview: LabPreview, sampleId: string, nutrientId: string) {
  const sample = preview.samples.find((s) => s.sampleId === sampleId);
  assert.ok(sample, `sample ${sampleId}`);
  return sample.values.find((v) => v.nutrientId === nutrientId);
}

export const errors = (preview: LabPreview) => preview.issues.filter((i) => i.severity === 'error');

/** A file of about `bytes` bytes in the sample-per-row layout, with `rows` lines of good data. */
export function bigFile(bytes: number): string {
  const header = 'Sample,Dry matter %,Crude protein %,Crude fat %,Ash %,Comment\n';
  const lines: string[] = [header];
  let size = header.length;
  for (let i = 0; size < bytes; i++) {
    const line = `S-${i},92.4,41.8,27.6,8.2,${'x'.repeat(400)}\n`;
    lines.push(line);
    size += line.length;
  }
  return lines.join('');
}
