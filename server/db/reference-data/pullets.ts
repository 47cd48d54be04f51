/**
 * Reference specifications for replacement pullets (immature Leghorn-type chickens), added to the
 * reference library after its first version, with the phase from 18 weeks to the first egg. Written by
 * the seed step `reference-pullets-v1`, so databases that already hold the library receive them too.
 */
import { and, eq, isNull } from 'drizzle-orm';

import type { Db } from '../client';
import { phases, species, specificationCaps, specificationNutrients, specifications } from '../schema';
import type { ReferenceBound, ReferenceCap, ReferencePhase, ReferenceSpecification } from './requirements';

/** The phase the first library version lacked: 18 weeks of age until the pullet lays its first egg. */
export const PULLET_PRE_LAY_PHASE: ReferencePhase = {
  code: 'pullet-18-lay',
  speciesCode: 'pullet',
  name: 'Pre-lay',
  span: '18 weeks to first egg',
  ageFromDays: 126,
  sortOrder: 40,
};

/** The library's pullet phases by code, with the age band that identifies each in the database. */
const PULLET_PHASE_AGES: Record<string, { ageFromDays: number; ageToDays: number | null }> = {
  'pullet-0-6': { ageFromDays: 0, ageToDays: 42 },
  'pullet-6-12': { ageFromDays: 42, ageToDays: 84 },
  'pullet-12-18': { ageFromDays: 84, ageToDays: 126 },
  'pullet-18-lay': { ageFromDays: 126, ageToDays: null },
};

export const PULLET_TABLE = 'NRC (1994) Nutrient Requirements of Poultry, 9th rev. ed., Table 2-1 (p. 19)';
const PULLET_SOURCE = `${PULLET_TABLE}, immature Leghorn-type chickens, white-egg-laying strains; values from memory of the table, to confirm against the print`;
const PULLET_NOTES =
  'Total amino acids, as NRC (1994) gives them: these bounds can only be met on the total basis, not by digestible values. ' +
  'White-egg-laying strains; NRC lists brown-egg strains in their own columns. Every value is recalled from the table and still to be checked against the printed page.';
const FROM_MEMORY = `From memory of ${PULLET_TABLE}, to confirm`;

/**
 * NRC (1994) Table 2-1, white-egg-laying pullets, % of the diet as fed (90 % DM) and MEn kcal/kg.
 * Columns: 0–6, 6–12, 12–18 weeks and 18 weeks to first egg. All from memory.
 */
export const PULLET_COLUMNS: Record<'pullet-0-6' | 'pullet-6-12' | 'pullet-12-18' | 'pullet-18-lay', Record<string, number>> = {
  'pullet-0-6': { amen_poultry: 2850, cp: 18, lys: 0.85, met: 0.3, metcys: 0.62, ca: 0.9, avp: 0.4, na: 0.15, cl: 0.15, linoleic: 1.0 },
  'pullet-6-12': { amen_poultry: 2850, cp: 16, lys: 0.6, met: 0.25, metcys: 0.52, ca: 0.8, avp: 0.35, na: 0.15, cl: 0.12, linoleic: 1.0 },
  'pullet-12-18': { amen_poultry: 2900, cp: 15, lys: 0.45, met: 0.2, metcys: 0.42, ca: 0.8, avp: 0.3, na: 0.15, cl: 0.12, linoleic: 1.0 },
  'pullet-18-lay': { amen_poultry: 2900, cp: 17, lys: 0.52, met: 0.22, metcys: 0.47, ca: 2.0, avp: 0.32, na: 0.15, cl: 0.15, linoleic: 1.0 },
};

const NOTE_BY_NUTRIENT: Record<string, string> = {
  amen_poultry: `Typical dietary energy concentration (MEn) of the table, not a requirement. ${FROM_MEMORY}`,
  cp: `A guide rather than a requirement as such. ${FROM_MEMORY}`,
};

// Suggested soft cap: a tested level from a feeding trial, not a legal limit. Warn above, never block.
const BSF_PRE_LAY: ReferenceCap = {
  scope: 'insect_species',
  insectSpecies: 'hermetia_illucens',
  maxPct: 7.5,
  source: 'Mwaniki, Neijat & Kiarie 2018: defatted meal at 0, 5.0, 7.5 % from week 19 to 27; 7.5 % laid as well as the control',
  note: 'The trial started at week 19, within this phase; no trial at younger ages was found',
};

function pulletSpecification(phaseCode: keyof typeof PULLET_COLUMNS, name: string): ReferenceSpecification {
  return {
    code: `nrc1994-${phaseCode}`,
    speciesCode: 'pullet',
    phaseCode,
    name,
    source: PULLET_SOURCE,
    notes: PULLET_NOTES,
    bounds: Object.entries(PULLET_COLUMNS[phaseCode]).map(([nutrientId, min]): ReferenceBound => ({ nutrientId, min, confidence: 'from_memory', note: NOTE_BY_NUTRIENT[nutrientId] ?? FROM_MEMORY })),
    caps: phaseCode === 'pullet-18-lay' ? [BSF_PRE_LAY] : [],
  };
}

export const PULLET_SPECIFICATIONS: ReferenceSpecification[] = [
  pulletSpecification('pullet-0-6', 'Pullet, white-egg, 0–6 weeks'),
  pulletSpecification('pullet-6-12', 'Pullet, white-egg, 6–12 weeks'),
  pulletSpecification('pullet-12-18', 'Pullet, white-egg, 12–18 weeks'),
  pulletSpecification('pullet-18-lay', 'Pullet, white-egg, 18 weeks to first egg'),
];

/** The seed step that adds the pullet specifications; it runs once per database, after `reference-library-v1`. */
export const REFERENCE_PULLETS_STEP = { name: 'reference-pullets-v1', apply: (tx: Db) => seedReferencePullets(tx) };

/** Adds the pre-lay phase and the pullet specifications to the reference library (needs `reference-library-v1`). */
export async function seedReferencePullets(tx: Db): Promise<void> {
  const [pullet] = await tx.select().from(species).where(and(isNull(species.organizationId), eq(species.code, 'pullet')));
  if (!pullet) throw new Error('The reference library has no pullet species: apply reference-library-v1 first.');
  const referencePhases = await tx.select().from(phases).where(and(eq(phases.speciesId, pullet.id), isNull(phases.organizationId)));
  const findPhase = (code: string) => {
    const age = PULLET_PHASE_AGES[code];
    return referencePhases.find((p) => p.ageFromDays === age.ageFromDays && p.ageToDays === age.ageToDays);
  };
  if (!findPhase(PULLET_PRE_LAY_PHASE.code)) {
    const { code: _code, speciesCode: _species, ...phase } = PULLET_PRE_LAY_PHASE;
    const [{ id }] = await tx.insert(phases).values({ ...phase, organizationId: null, speciesId: pullet.id }).$returningId();
    referencePhases.push((await tx.select().from(phases).where(eq(phases.id, id)))[0]);
  }
  for (const spec of PULLET_SPECIFICATIONS) {
    const [existing] = await tx.select({ id: specifications.id }).from(specifications).where(and(isNull(specifications.organizationId), eq(specifications.code, spec.code)));
    if (existing) continue;
    const phase = findPhase(spec.phaseCode);
    if (!phase) throw new Error(`The reference library has no pullet phase for ${spec.phaseCode}.`);
    const [{ id }] = await tx
      .insert(specifications)
      .values({ organizationId: null, code: spec.code, speciesId: pullet.id, phaseId: phase.id, name: spec.name, source: spec.source, notes: spec.notes ?? null })
      .$returningId();
    await tx.insert(specificationNutrients).values(spec.bounds.map((b) => ({ specificationId: id, nutrientId: b.nutrientId, min: b.min ?? null, max: b.max ?? null, confidence: b.confidence, note: b.note ?? null })));
    if (spec.caps?.length) {
      await tx.insert(specificationCaps).values(
        spec.caps.map((c) => ({ specificationId: id, scope: c.scope, category: c.category ?? null, insectSpecies: c.insectSpecies ?? null, maxPct: c.maxPct, soft: true, source: c.source, note: c.note ?? null })),
      );
    }
  }
}
