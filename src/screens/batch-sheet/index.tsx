import { useState } from 'react';
import { Platform, ScrollView, StyleSheet, View } from 'react-native';
import { Link } from 'expo-router';
import { Formik } from 'formik';
import * as yup from 'yup';

import { batchSheetCsvUrl, useBatchLogQuery, useBatchSheetQuery, useRecordBatchMutation, type SheetParams } from '@/api/batch-sheets';
import { ApiError } from '@/api/client';
import { useActiveMembership } from '@/api/session';
import { CautionBanner } from '@/components/caution-banner';
import { ErrorState } from '@/components/error-state';
import { FormMessage } from '@/components/form-message';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { AppText, Figure } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { ADDITION_GROUP_LABELS, type AdditionGroup } from '@/shared/batch-sheet';
import type { BatchSheetResponse } from '@/shared/schemas/batch-sheets';
import { formatMoney } from '@/shared/measures';
import { colors, radius, space } from '@/theme';

import { SignedInGate } from '../shared-result/signed-in-gate';
import { PrintStyles } from './print-styles';

const num = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));

/** The batch sheet of an approved version: amounts for the batch to make, order of addition, sign-off, print and CSV. */
export function BatchSheetScreen({ versionId }: { versionId: number }) {
  return (
    <SignedInGate path={`/batch-sheet/${versionId}`}>
      <BatchSheetBody versionId={versionId} />
    </SignedInGate>
  );
}

function BatchSheetBody({ versionId }: { versionId: number }) {
  const [params, setParams] = useState<SheetParams>({});
  const [draft, setDraft] = useState({ batchSize: '', macroStep: '', minorStep: '' });
  const sheet = useBatchSheetQuery(versionId, params);
  const { can } = useActiveMembership();
  const b = sheet.data;
  const unit = b?.massUnit ?? 'kg';
  const apply = () => setParams({ batchSize: num(draft.batchSize), macroStep: num(draft.macroStep), minorStep: num(draft.minorStep) });
  const fieldError = (k: string) => (sheet.error instanceof ApiError ? sheet.error.fieldErrors[k]?.[0] : undefined);

  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID="screen-batch-sheet-page">
      <PrintStyles />
      <View style={styles.column}>
        <View testID="no-print-nav">
          <Link href="/" style={styles.back}>← Formulas</Link>
        </View>
        <AppText variant="display" accessibilityRole="header" style={styles.title}>{b ? `Batch sheet: ${b.formulaName}` : 'Batch sheet'}</AppText>
        {b ? (
          <AppText variant="lead" testID="sheet-version">
            Version {b.version.number}, approved by {b.version.approvedBy} on {b.version.approvedAt?.slice(0, 10)}
            {b.species ? ` · ${b.species}` : ''}{b.specification ? ` · ${b.specification.name}` : ''} · amounts as fed
          </AppText>
        ) : null}
        <CautionBanner />
        {sheet.isError && !(sheet.error instanceof ApiError && sheet.error.status === 400) ? <ErrorState error={sheet.error} onRetry={() => sheet.refetch()} /> : null}
        {sheet.isPending ? <AppText muted>Loading…</AppText> : null}

        {b ? (
          <Card title="Batch to make" testID="no-print-controls">
            <View style={styles.controls}>
              <View style={styles.control}>
                <TextField label="Batch size" hint={unit} keyboardType="decimal-pad" placeholder={String(b.sheet.batchSize)} value={draft.batchSize} onChangeText={(v) => setDraft((d) => ({ ...d, batchSize: v }))} error={fieldError('batchSize')} testID="sheet-batch-size" onSubmitEditing={apply} />
              </View>
              <View style={styles.control}>
                <TextField label="Main scale step" hint={unit} keyboardType="decimal-pad" placeholder={String(b.sheet.macroStep)} value={draft.macroStep} onChangeText={(v) => setDraft((d) => ({ ...d, macroStep: v }))} error={fieldError('macroStep')} testID="sheet-macro-step" />
              </View>
              <View style={styles.control}>
                <TextField label="Small scale step" hint={unit} keyboardType="decimal-pad" placeholder={String(b.sheet.minorStep)} value={draft.minorStep} onChangeText={(v) => setDraft((d) => ({ ...d, minorStep: v }))} error={fieldError('minorStep')} testID="sheet-minor-step" />
              </View>
            </View>
            <View style={styles.actions}>
              <Button label="Work out the amounts" onPress={apply} testID="sheet-apply" />
              {Platform.OS === 'web' ? <Button label="Print" tone="quiet" onPress={() => window.print()} testID="sheet-print" /> : null}
              {Platform.OS === 'web' ? (
                <a href={batchSheetCsvUrl(versionId, params)} download data-testid="sheet-csv" style={{ alignSelf: 'center', color: colors.brand, fontFamily: 'inherit' }}>Download CSV</a>
              ) : null}
            </View>
          </Card>
        ) : null}

        {b ? <SheetTable b={b} /> : null}
        {b ? <SignOff /> : null}
        {b && can('batches:record') ? <RecordBatch versionId={versionId} b={b} /> : null}
        <BatchLog versionId={versionId} />
      </View>
    </ScrollView>
  );
}

function SheetTable({ b }: { b: BatchSheetResponse }) {
  const groups: AdditionGroup[] = ['macro', 'minor', 'liquid'];
  return (
    <Card title={`Amounts for ${b.sheet.batchSize} ${b.massUnit}`} testID="sheet-table">
      {groups.map((g) => {
        const lines = b.sheet.lines.filter((l) => l.group === g);
        if (lines.length === 0) return null;
        return (
          <View key={g} style={styles.group} testID={`sheet-group-${g}`}>
            <AppText variant="label" style={styles.groupTitle}>{ADDITION_GROUP_LABELS[g]}</AppText>
            {lines.map((l) => (
              <View key={l.id} style={styles.line} testID="sheet-line">
                <AppText style={styles.order}>{l.order}.</AppText>
                <View style={styles.lineMain}>
                  <AppText style={styles.lineName}>{l.name}</AppText>
                  {l.callOut ? <AppText variant="small" style={styles.callOut} testID="sheet-call-out">{l.callOut}</AppText> : null}
                  <AppText variant="caption" muted>{l.percent.toFixed(3)} % of the batch · scale step {l.step} {b.massUnit}</AppText>
                </View>
                <Figure value={l.amount.toFixed(l.decimals)} unit={b.massUnit} style={styles.amount} testID="sheet-amount" />
                <View style={styles.tick} accessibilityLabel="Tick when added" />
              </View>
            ))}
          </View>
        );
      })}
      <View style={[styles.line, styles.totalLine]} testID="sheet-total">
        <AppText style={styles.lineName}>Total</AppText>
        <Figure value={String(b.sheet.total)} unit={b.massUnit} style={styles.amount} />
      </View>
      <AppText variant="small" muted>
        Rounded to the scale steps; the total differs from the batch size by {b.sheet.difference} {b.massUnit} (at most half a main-scale step).
        Cost of this batch at the version’s prices: {formatMoney(b.costPerBatch, b.measures.currency, 2)}.
      </AppText>
      {b.capWarnings.map((w) => <AppText key={w} variant="small" style={styles.callOut}>{w}</AppText>)}
    </Card>
  );
}

function SignOff() {
  return (
    <View style={styles.signOff} testID="sheet-sign-off">
      {['Operator’s initials', 'Date and time made', 'Checked by', 'Deviations'].map((label) => (
        <View key={label} style={styles.signBox}>
          <AppText variant="caption" muted>{label}</AppText>
        </View>
      ))}
    </View>
  );
}

const recordSchema = yup.object({
  madeOn: yup.string().required('enter the date it was made').matches(/^\d{4}-\d{2}-\d{2}$/, 'write the date as YYYY-MM-DD'),
  batchSize: yup.number().typeError('enter the batch size as a number').required('enter the batch size').moreThan(0, 'the batch must be more than 0'),
  operatorName: yup.string().trim().required('enter the operator’s name or initials').max(120),
  deviation: yup.string().max(1000, 'at most 1,000 characters'),
});

function RecordBatch({ versionId, b }: { versionId: number; b: BatchSheetResponse }) {
  const record = useRecordBatchMutation();
  const [done, setDone] = useState<string | null>(null);
  return (
    <Card title="Record the batch as made" testID="no-print-record">
      <Formik
        initialValues={{ madeOn: new Date().toISOString().slice(0, 10), batchSize: String(b.sheet.batchSize), operatorName: '', deviation: '' }}
        validationSchema={recordSchema}
        onSubmit={async (v, { setErrors, resetForm }) => {
          setDone(null);
          try {
            const saved = await record.mutateAsync({ versionId, madeOn: v.madeOn, batchSize: Number(v.batchSize), operatorName: v.operatorName, deviation: v.deviation || null });
            resetForm();
            setDone(`Recorded: ${saved.batchSize} ${saved.massUnit} on ${saved.madeOn} by ${saved.operatorName}.`);
          } catch (e) {
            // The mutation keeps the error for the message above the button; field errors go on their fields.
            if (e instanceof ApiError) setErrors(Object.fromEntries(Object.entries(e.fieldErrors).map(([k, m]) => [k, m[0]])));
          }
        }}
      >
        {(f) => (
          <View style={styles.form}>
            <TextField label="Date made" hint="YYYY-MM-DD" value={f.values.madeOn} onChangeText={f.handleChange('madeOn')} onBlur={f.handleBlur('madeOn')} error={f.touched.madeOn && f.errors.madeOn} testID="record-date" />
            <TextField label="Batch size" hint={b.massUnit} keyboardType="decimal-pad" value={f.values.batchSize} onChangeText={f.handleChange('batchSize')} onBlur={f.handleBlur('batchSize')} error={f.touched.batchSize && f.errors.batchSize} testID="record-size" />
            <TextField label="Operator" value={f.values.operatorName} onChangeText={f.handleChange('operatorName')} onBlur={f.handleBlur('operatorName')} error={f.touched.operatorName && f.errors.operatorName} testID="record-operator" />
            <TextField label="Deviation, if any" multiline value={f.values.deviation} onChangeText={f.handleChange('deviation')} error={f.touched.deviation && f.errors.deviation} testID="record-deviation" />
            <FormMessage tone="danger" text={record.error && !(record.error instanceof ApiError && record.error.status === 400) ? record.error.message : null} />
            <FormMessage tone="ok" text={done} testID="record-done" />
            <Button label={f.isSubmitting ? 'Saving…' : 'Record batch'} disabled={f.isSubmitting} onPress={() => f.handleSubmit()} testID="record-submit" />
          </View>
        )}
      </Formik>
    </Card>
  );
}

function BatchLog({ versionId }: { versionId: number }) {
  const log = useBatchLogQuery(versionId);
  if (!log.data || log.data.length === 0) return null;
  return (
    <Card title="Batches made from this version" testID="no-print-log">
      {log.data.map((e) => (
        <View key={e.id} style={styles.logRow}>
          <AppText>{e.madeOn} · {e.operatorName}</AppText>
          <Figure value={String(e.batchSize)} unit={e.massUnit} />
          {e.deviation ? <AppText variant="small" style={styles.callOut}>Deviation: {e.deviation}</AppText> : null}
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { padding: space.lg, paddingBottom: space.xxl },
  column: { width: '100%', maxWidth: 900, alignSelf: 'center', gap: space.lg },
  title: { color: colors.brand },
  back: { color: colors.brand, paddingVertical: space.sm },
  controls: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  control: { flexGrow: 1, flexBasis: 160 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'center' },
  group: { gap: space.xs, marginBottom: space.md },
  groupTitle: { color: colors.brand },
  line: { flexDirection: 'row', alignItems: 'center', gap: space.sm, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.rule },
  totalLine: { borderBottomWidth: 0, borderTopWidth: 2, borderTopColor: colors.ink },
  order: { width: 28, fontWeight: '600' },
  lineMain: { flex: 1, minWidth: 0, gap: 2 },
  lineName: { fontWeight: '600', flex: 1 },
  amount: { minWidth: 110, textAlign: 'right', fontWeight: '600' },
  tick: { width: 28, height: 28, borderWidth: 1.5, borderColor: colors.ink, borderRadius: radius.sm },
  callOut: { color: colors.caution },
  signOff: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  signBox: { flexGrow: 1, flexBasis: 180, minHeight: 64, padding: space.sm, borderWidth: 1, borderColor: colors.ink, borderRadius: radius.sm },
  form: { gap: space.md },
  logRow: { gap: 2, paddingVertical: space.sm, borderBottomWidth: 1, borderBottomColor: colors.rule },
});
