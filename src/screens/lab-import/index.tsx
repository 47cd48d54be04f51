import { useMemo, useState } from 'react';
import { Link, Redirect } from 'expo-router';
import { StyleSheet, View } from 'react-native';

import { ApiError } from '@/api/client';
import { useLabImportCommitMutation, useLabImportPreviewMutation, useLabTargetIngredientsQuery } from '@/api/lab-imports';
import { useActiveMembership, useSessionQuery } from '@/api/session';
import { CautionBanner } from '@/components/caution-banner';
import { FormMessage } from '@/components/form-message';
import { FullPageState } from '@/components/full-page-state';
import { Screen } from '@/components/screen';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import { AppText } from '@/components/ui/text';
import { checkFileSize, parseCsvInChunks } from '@/shared/lab-import/csv';
import { ESTIMATION_CLASSES } from '@/shared/lab-import/estimate';
import { nutrientOfAux } from '@/shared/lab-import/words';
import { AUX_TARGETS, SOURCE_UNITS, type ColumnMapping, type DecimalMark, type Delimiter, type LabIssue, type Layout, type ReportBasis, type SourceUnit } from '@/shared/lab-import/types';
import { INGREDIENT_CATEGORIES, INGREDIENT_CATEGORY_LABELS, INSECT_PROCESSING, INSECT_PROCESSING_LABELS, INSECT_SPECIES, INSECT_SPECIES_LABELS, type IngredientCategory, type InsectProcessing, type InsectSpecies } from '@/shared/library-terms';
import type { CommitLabImportInput, LabImportPreviewResponse, LabImportResult } from '@/shared/schemas/lab-imports';
import { colors, space } from '@/theme';

import { SamplePreview } from './sample-preview';
import { FileButton, progressStyles, Select, type SelectOption } from './web-inputs';

type LoadedFile = { name: string; text: string };
type Options = { delimiter: Delimiter | 'auto'; decimal: DecimalMark | 'auto'; layout: Layout | 'auto'; basis: ReportBasis };

const AUX_LABELS: Record<string, string> = { 'aux:moisture': 'Moisture (gives dry matter)', 'aux:adf': 'ADF (for pig energy)', 'aux:ndf': 'NDF (for pig energy)', 'aux:cys': 'Cystine (adds to methionine)', 'aux:nfe': 'Nitrogen-free extract' };

const today = () => new Date().toISOString().slice(0, 10);

/**
 * ADF and NDF were only inputs to the pig energy equations before the catalogue held them; once it does, the
 * nutrient is the one choice (a lab's remembered mapping to the old target still shows, so it can be changed).
 */
function supersededAux(target: string, preview: LabImportPreviewResponse, mapping: ColumnMapping | undefined): boolean {
  const nutrient = nutrientOfAux(target);
  if (!nutrient || !preview.catalogue.some((n) => n.id === nutrient)) return false;
  return !preview.fields.some((field) => (mapping?.[field.key] ?? field.mapping).target === target);
}

/** Upload a lab's CSV, map its columns, check it and save it as a new ingredient or a dated analysis of one. */
export function LabImportScreen() {
  const session = useSessionQuery();
  const { can } = useActiveMembership();
  if (session.isError) return <FullPageState error={session.error} onRetry={() => session.refetch()} />;
  if (!session.isSuccess) return <FullPageState message="Loading…" />;
  if (!session.data) return <Redirect href="/sign-in?next=%2Flab-import" />;
  if (!can('lab:import')) {
    return (
      <Screen title="Import a lab analysis" testID="screen-lab-import">
        <BackLink />
        <FormMessage tone="danger" text="Your role in this organization does not import lab analyses. Ask an owner, nutritionist or advisor." />
      </Screen>
    );
  }
  return <LabImportFlow />;
}

function BackLink() {
  return (
    <View style={styles.links}>
      <Link href="/library" testID="back-to-library">
        <AppText style={styles.link}>← Back to library</AppText>
      </Link>
      <Link href="/lab-import/history" testID="to-analyses-history">
        <AppText style={styles.link}>Compare analyses</AppText>
      </Link>
    </View>
  );
}

function LabImportFlow() {
  const [labName, setLabName] = useState('');
  const [file, setFile] = useState<LoadedFile | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [localIssues, setLocalIssues] = useState<LabIssue[]>([]);
  const [options, setOptions] = useState<Options>({ delimiter: 'auto', decimal: 'auto', layout: 'auto', basis: 'as_fed' });
  const [classId, setClassId] = useState('other');
  const [mapping, setMapping] = useState<ColumnMapping | undefined>(undefined);
  const [overrides, setOverrides] = useState<Record<string, Record<string, number | null>>>({});
  const [preview, setPreview] = useState<LabImportPreviewResponse | null>(null);
  const [result, setResult] = useState<LabImportResult | null>(null);
  const previewMutation = useLabImportPreviewMutation();
  const commitMutation = useLabImportCommitMutation();

  const runPreview = (over: Partial<{ file: LoadedFile; options: Options; classId: string; mapping: ColumnMapping | undefined; overrides: typeof overrides }> = {}) => {
    const f = over.file ?? file;
    if (!f) return;
    const o = over.options ?? options;
    previewMutation.mutate(
      { fileName: f.name, text: f.text, labName, ...o, mapping: 'mapping' in over ? over.mapping : mapping, estimation: { classId: over.classId ?? classId }, overrides: over.overrides ?? overrides },
      {
        onSuccess: (data) => {
          setPreview(data);
          if (data.fields.length) setMapping(Object.fromEntries(data.fields.map((field) => [field.key, field.mapping])));
        },
      },
    );
  };

  const onFile = async (chosen: File) => {
    setResult(null);
    setPreview(null);
    setMapping(undefined);
    setOverrides({});
    commitMutation.reset();
    const tooBig = checkFileSize(chosen.size);
    if (tooBig) {
      setFile(null);
      setLocalIssues([tooBig]);
      return;
    }
    setProgress(0);
    const text = await chosen.text();
    // Read in the browser first, in chunks, so a large file shows progress and obvious problems show at once.
    const parsed = await parseCsvInChunks(text, options, setProgress);
    setProgress(null);
    const loaded = { name: chosen.name, text };
    setFile(loaded);
    setLocalIssues(parsed.ok ? [] : parsed.issues);
    if (parsed.ok) runPreview({ file: loaded, mapping: undefined, overrides: {} });
  };

  const changeOptions = (next: Partial<Options>) => {
    const merged = { ...options, ...next };
    setOptions(merged);
    // A new layout or separator names the fields differently: start the mapping again.
    const resetMapping = next.layout !== undefined || next.delimiter !== undefined;
    if (resetMapping) setMapping(undefined);
    runPreview({ options: merged, ...(resetMapping ? { mapping: undefined } : {}) });
  };

  const changeMapping = (key: string, patch: Partial<ColumnMapping[string]>) => {
    if (!mapping) return;
    const next = { ...mapping, [key]: { ...mapping[key], ...patch } };
    setMapping(next);
    runPreview({ mapping: next });
  };

  const override = (sampleId: string, nutrientId: string, value: number | null) => {
    const next = { ...overrides, [sampleId]: { ...(overrides[sampleId] ?? {}), [nutrientId]: value } };
    setOverrides(next);
    runPreview({ overrides: next });
  };

  const issues = preview ? preview.issues : localIssues;
  const errors = issues.filter((i) => i.severity === 'error');

  return (
    <Screen title="Import a lab analysis" lead="Upload the CSV file the feed lab sent. Nothing is saved until you press Save." testID="screen-lab-import">
      <BackLink />
      <Card title="1. The file">
        <TextField label="Laboratory" hint="its column mapping is remembered" value={labName} onChangeText={setLabName} onBlur={() => file && runPreview()} placeholder="e.g. Wend Feed Lab" testID="lab-name" />
        <FileButton label={file ? `Choose another file (now: ${file.name})` : 'Choose a CSV file'} onFile={onFile} testID="lab-file" />
        <AppText variant="caption" muted>Comma, semicolon or tab separated; decimal point or comma; one sample per row or one nutrient per row; at most 2 MB and 5,000 lines.</AppText>
        {progress !== null ? (
          <View accessibilityRole="progressbar" aria-valuenow={Math.round(progress * 100)} testID="parse-progress">
            <AppText variant="small">Reading the file… {Math.round(progress * 100)} %</AppText>
            <View style={progressStyles.track}>
              <View style={[progressStyles.bar, { width: `${Math.round(progress * 100)}%` }]} />
            </View>
          </View>
        ) : null}
        {previewMutation.isPending ? <AppText variant="small" muted testID="checking">Checking the file…</AppText> : null}
        {previewMutation.error ? <FormMessage tone="danger" text={previewMutation.error.message} /> : null}
      </Card>

      {errors.length > 0 ? (
        <View style={styles.issues} accessibilityRole="alert" testID="lab-issues">
          <AppText variant="label">{errors.length === 1 ? 'One problem to fix before saving' : `${errors.length} problems to fix before saving`}</AppText>
          {errors.map((issue, i) => (
            <AppText key={i} variant="small" testID="lab-issue">
              {issue.line !== null ? `Line ${issue.line}${issue.column ? `, column “${issue.column}”` : ''}: ` : issue.column ? `Column “${issue.column}”: ` : ''}
              {issue.message}
            </AppText>
          ))}
        </View>
      ) : null}

      {file && preview ? (
        <>
          <Card title="2. How to read it">
            <ChoiceChips label="Layout" value={options.layout} onChange={(layout) => changeOptions({ layout })} testID="opt-layout" options={[{ value: 'auto', label: `Detect (${preview.file.layout === 'nutrient_per_row' ? 'one nutrient per row' : 'one sample per row'})` }, { value: 'sample_per_row', label: 'One sample per row' }, { value: 'nutrient_per_row', label: 'One nutrient per row' }]} />
            <ChoiceChips label="Separator" value={options.delimiter} onChange={(delimiter) => changeOptions({ delimiter })} testID="opt-delimiter" options={[{ value: 'auto', label: 'Detect' }, { value: ',', label: 'Comma' }, { value: ';', label: 'Semicolon' }, { value: '\t', label: 'Tab' }]} />
            <ChoiceChips label="Decimal mark" value={options.decimal} onChange={(decimal) => changeOptions({ decimal })} testID="opt-decimal" options={[{ value: 'auto', label: `Detect (${preview.file.decimal === ',' ? 'comma' : 'point'})` }, { value: '.', label: 'Point 12.5' }, { value: ',', label: 'Comma 12,5' }]} />
            <ChoiceChips label="Values are reported (where a column does not say)" value={options.basis} onChange={(basis) => changeOptions({ basis })} testID="opt-basis" options={[{ value: 'as_fed', label: 'As fed' }, { value: 'dry_matter', label: 'On dry matter' }]} />
          </Card>

          <Card title="3. Columns and nutrients">
            {preview.remembered ? <AppText variant="small" muted testID="mapping-remembered">The mapping saved for this laboratory was applied; change what differs.</AppText> : null}
            <MappingList preview={preview} mapping={mapping} onChange={changeMapping} />
          </Card>

          <Card title="4. Gaps: energy and digestible amino acids">
            <AppText variant="small" muted>Values the lab did not report are estimated with published equations and digestibility coefficients for the kind of ingredient. Each estimate names its source; type your own value over any of them.</AppText>
            <Select label="Kind of ingredient" value={classId} onChange={(id) => (setClassId(id), runPreview({ classId: id }))} options={ESTIMATION_CLASSES.map((c) => ({ value: c.id, label: c.label }))} testID="estimation-class" />
          </Card>

          <CautionBanner />
          {preview.samples.map((sample) => (
            <SamplePreview key={sample.sampleId} sample={sample} catalogue={preview.catalogue} onOverride={(nutrientId, value) => override(sample.sampleId, nutrientId, value)} />
          ))}

          {result ? (
            <SavedCard result={result} />
          ) : (
            <SaveCard
              preview={preview}
              classId={classId}
              disabled={!preview.ok || commitMutation.isPending}
              error={commitMutation.error}
              onSave={(samples, analysedOn) =>
                commitMutation.mutate(
                  { fileName: file.name, text: file.text, labName: labName.trim(), ...options, mapping, estimation: { classId }, overrides, analysedOn, samples },
                  { onSuccess: setResult },
                )
              }
            />
          )}
        </>
      ) : null}
    </Screen>
  );
}

function MappingList({ preview, mapping, onChange }: { preview: LabImportPreviewResponse; mapping: ColumnMapping | undefined; onChange: (key: string, patch: Partial<ColumnMapping[string]>) => void }) {
  const targets: SelectOption[] = useMemo(
    () => [
      { value: 'ignore', label: 'Not imported' },
      { value: 'sample_id', label: 'Sample id', group: 'The sample' },
      { value: 'sample_name', label: 'Sample name', group: 'The sample' },
      { value: 'analysed_on', label: 'Date analysed', group: 'The sample' },
      ...preview.catalogue.map((n) => ({ value: n.id, label: `${n.name} (${n.unit})`, group: 'Nutrients' })),
      ...AUX_TARGETS.filter((t) => !supersededAux(t, preview, mapping)).map((t) => ({ value: t, label: AUX_LABELS[t], group: 'Used for estimates' })),
    ],
    [preview, mapping],
  );
  const units = SOURCE_UNITS.map((u) => ({ value: u, label: u }));
  return (
    <View style={styles.mapping}>
      {preview.fields.map((field, i) => {
        const m = mapping?.[field.key] ?? field.mapping;
        const sampleField = ['sample_id', 'sample_name', 'analysed_on', 'ignore'].includes(m.target);
        return (
          <View key={field.key} style={styles.mapRow} testID={`map-row-${i}`}>
            <View style={styles.mapName}>
              <AppText variant="small" style={styles.bold}>{field.key}</AppText>
              <AppText variant="caption" muted>
                {field.line !== null && preview.file.layout === 'nutrient_per_row' ? `line ${field.line} · ` : ''}e.g. {field.examples.filter(Boolean).slice(0, 2).join(', ') || '(empty)'}
                {field.suggestion.target === m.target && m.target !== 'ignore' ? ' · suggested' : ''}
              </AppText>
            </View>
            <Select label={`What “${field.key}” holds`} value={m.target} options={targets} onChange={(target) => onChange(field.key, { target })} testID={`map-target-${i}`} />
            {!sampleField ? (
              <>
                <Select label={`Unit of “${field.key}”`} value={m.unit} options={units} onChange={(unit) => onChange(field.key, { unit: unit as SourceUnit })} testID={`map-unit-${i}`} />
                {m.target !== 'dm' && m.target !== 'aux:moisture' ? (
                  <Select label={`Basis of “${field.key}”`} value={m.basis} options={[{ value: 'as_fed', label: 'as fed' }, { value: 'dry_matter', label: 'on DM' }]} onChange={(basis) => onChange(field.key, { basis: basis as ReportBasis })} testID={`map-basis-${i}`} />
                ) : null}
              </>
            ) : null}
          </View>
        );
      })}
    </View>
  );
}

type Target = CommitLabImportInput['samples'][number]['target'];

function SaveCard({ preview, classId, disabled, error, onSave }: { preview: LabImportPreviewResponse; classId: string; disabled: boolean; error: Error | null; onSave: (samples: CommitLabImportInput['samples'], analysedOn: string) => void }) {
  const cls = ESTIMATION_CLASSES.find((c) => c.id === classId);
  const [mode, setMode] = useState<'new' | 'existing'>('new');
  const [names, setNames] = useState<Record<string, string>>({});
  const [category, setCategory] = useState<IngredientCategory>(cls?.insect ? 'insect_meal' : 'oilseed_meal');
  const [species, setSpecies] = useState<InsectSpecies>('hermetia_illucens');
  const [processing, setProcessing] = useState<InsectProcessing>('partially_defatted');
  const [substrate, setSubstrate] = useState('');
  const [origin, setOrigin] = useState<'plant' | 'unknown'>('plant');
  const [existingId, setExistingId] = useState('');
  const [analysedOn, setAnalysedOn] = useState(today());
  const targets = useLabTargetIngredientsQuery();
  const needsDate = preview.samples.some((s) => !s.analysedOn);
  const fieldErrors = error instanceof ApiError ? error.fieldErrors : {};

  const save = () => {
    const samples = preview.samples.map((s) => {
      const target: Target =
        mode === 'existing'
          ? { kind: 'existing', ingredientId: Number(existingId) }
          : {
              kind: 'new',
              name: (names[s.sampleId] ?? s.name ?? `Lab sample ${s.sampleId}`).trim(),
              category,
              insect: category === 'insect_meal' ? { species, processing, substrate: substrate.trim(), substrateOrigin: origin, substrateAnimals: [] } : null,
            };
      return { sampleId: s.sampleId, target };
    });
    onSave(samples, analysedOn);
  };

  return (
    <Card title="5. Save">
      <ChoiceChips label="Save each sample as" value={mode} onChange={setMode} testID="save-mode" options={[{ value: 'new', label: 'A new ingredient' }, { value: 'existing', label: 'A new analysis of an existing ingredient' }]} />
      {mode === 'new' ? (
        <>
          {preview.samples.map((s, i) => (
            <TextField key={s.sampleId} label={`Name for sample ${s.sampleId}`} value={names[s.sampleId] ?? s.name ?? `Lab sample ${s.sampleId}`} onChangeText={(v) => setNames({ ...names, [s.sampleId]: v })} testID={`new-name-${i}`} />
          ))}
          <Select label="Category" value={category} onChange={(v) => setCategory(v as IngredientCategory)} options={INGREDIENT_CATEGORIES.map((c) => ({ value: c, label: INGREDIENT_CATEGORY_LABELS[c] }))} testID="new-category" />
          {category === 'insect_meal' ? (
            <>
              <ChoiceChips label="Insect" value={species} onChange={setSpecies} options={INSECT_SPECIES.map((v) => ({ value: v, label: INSECT_SPECIES_LABELS[v] }))} testID="new-species" />
              <ChoiceChips label="Processing" value={processing} onChange={setProcessing} options={INSECT_PROCESSING.map((v) => ({ value: v, label: INSECT_PROCESSING_LABELS[v] }))} testID="new-processing" />
              <TextField label="What the larvae were reared on" value={substrate} onChangeText={setSubstrate} placeholder="e.g. brewery spent grains" testID="new-substrate" error={fieldErrors['samples[0].target.insect.substrate']?.[0]} />
              <ChoiceChips label="Substrate origin" value={origin} onChange={setOrigin} options={[{ value: 'plant', label: 'Plant' }, { value: 'unknown', label: 'Not known' }]} testID="new-origin" />
              <AppText variant="caption" muted>For a substrate of animal origin, add the ingredient in the library with its animals first, then add this analysis to it.</AppText>
            </>
          ) : null}
        </>
      ) : targets.data ? (
        targets.data.items.length ? (
          <Select label="Ingredient" value={existingId} onChange={setExistingId} options={[{ value: '', label: 'Choose an ingredient…' }, ...targets.data.items.map((t) => ({ value: String(t.id), label: `${t.name}${t.analyses ? ` (${t.analyses} analyses)` : ''}` }))]} testID="existing-ingredient" />
        ) : (
          <AppText muted>Your library has no ingredients of its own yet: save as a new ingredient.</AppText>
        )
      ) : (
        <AppText muted>Loading your ingredients…</AppText>
      )}
      {needsDate ? <TextField label="Date of analysis" hint="for samples without a date in the file" value={analysedOn} onChangeText={setAnalysedOn} testID="analysed-on" error={fieldErrors.analysedOn?.[0]} /> : null}
      {error ? <FormMessage tone="danger" text={error.message} testID="save-error" /> : null}
      <Button label={preview.samples.length > 1 ? `Save ${preview.samples.length} analyses` : 'Save the analysis'} onPress={save} disabled={disabled || (mode === 'existing' && !existingId)} testID="save-import" />
      {!preview.ok ? <AppText variant="small" muted>Fix the problems listed above first: nothing is saved while any remains.</AppText> : null}
    </Card>
  );
}

function SavedCard({ result }: { result: LabImportResult }) {
  return (
    <Card title="Saved" testID="import-saved">
      {result.analyses.map((a) => (
        <View key={a.id} style={styles.saved}>
          <AppText>
            {a.createdIngredient ? 'New ingredient' : 'New analysis of'} “{a.ingredientName}”, sample {a.sampleId}, analysed {a.analysedOn}. It can be used in formulas now.
          </AppText>
          <Link href={`/lab-import/history?ingredient=${a.ingredientId}`} testID={`history-${a.ingredientId}`}>
            <AppText style={styles.link}>Compare its analyses →</AppText>
          </Link>
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
  link: { color: colors.brand, textDecorationLine: 'underline' },
  issues: { gap: space.xs, padding: space.md, backgroundColor: colors.dangerSoft, borderLeftWidth: 4, borderLeftColor: colors.danger },
  mapping: { gap: space.sm },
  mapRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm, paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.paperSunken },
  mapName: { flexBasis: 180, flexGrow: 1 },
  bold: { fontWeight: '600' },
  saved: { gap: space.xs },
});
