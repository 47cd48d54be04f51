import { randomBytes } from 'node:crypto';
import { and, desc, eq, inArray, ne } from 'drizzle-orm';
import Papa from 'papaparse';
import type { z } from 'zod';

import { costPerBulkUnit, massFromKg, massUnit, pricePerMassUnit, bulkUnit, type Measures } from '../../../src/shared/measures';
import { level } from '../../../src/shared/ration-check';
import type { createShareInput, SharedPayload, ShareCreated, ShareDetail, ShareSummary, ShareTarget } from '../../../src/shared/schemas/shares';
import { badRequest, HttpError, notFound } from '../../http/errors';
import type { Mailer } from '../../mail/mailer';
import { sharedResultMail } from '../../mail/share-messages';
import type { Db } from '../client';
import { memberships, organizations, shares, users, type ShareRow } from '../schema';
import { formulaArchival, getVersion } from './formulas';
import { getMeasures } from './organization-settings';
import { runRationCheck } from './ration-checks';

type CreateInput = z.output<typeof createShareInput>;

const CAUTION = 'Decision support only: a veterinarian or qualified animal nutritionist must review a diet before it is fed; local feed rules (including those on insect protein) apply.';

/** The farms the caller belongs to (any role), to share with. */
export async function shareTargets(db: Db, userId: string): Promise<ShareTarget[]> {
  const rows = await db
    .select({ id: organizations.id, name: organizations.name, role: memberships.role })
    .from(memberships)
    .innerJoin(organizations, eq(organizations.id, memberships.organizationId))
    .where(and(eq(memberships.userId, userId), eq(organizations.kind, 'farm')));
  return rows.sort((a, b) => a.name.localeCompare(b.name));
}

/** A result as CSV (papaparse), in the reader's units and currency. */
export function shareCsv(payload: SharedPayload, measures: Measures): string {
  const unit = massUnit(measures.unitSystem);
  const cur = measures.currency;
  const rows: (string | number)[][] = [[`Troughline shared result. ${CAUTION}`]];
  if (payload.kind === 'formula_version') {
    const s = payload.snapshot;
    const r = s.result;
    rows.push(['Formula', payload.formulaName, 'Version', payload.version.number, 'Approved', payload.version.approvedAt ? `${payload.version.approvedBy} ${payload.version.approvedAt.slice(0, 10)}` : 'not approved']);
    rows.push(['Specification', s.specification ? `${s.specification.name} (${s.specification.source})` : '', 'Basis', 'as fed']);
    if (r.status !== 'optimal') {
      rows.push(['Status', r.status, 'message' in r ? r.message : '']);
      return Papa.unparse(rows, { newline: '\r\n' });
    }
    rows.push(['Batch', level(massFromKg(r.batchKg, measures.unitSystem)), unit, `Cost per ${bulkUnit(measures.unitSystem)}`, costPerBulkUnit(r.costPerTonne, measures.unitSystem).toFixed(2), cur]);
    rows.push([]);
    rows.push(['Ingredient', 'Share (%)', `Amount (${unit})`, `Price (${cur}/${unit})`, `Cost (${cur})`]);
    for (const m of r.mix) rows.push([m.name ?? m.id, m.percent.toFixed(3), massFromKg(m.kg, measures.unitSystem).toFixed(2), pricePerMassUnit(m.pricePerKg, measures.unitSystem).toFixed(4), m.cost.toFixed(2)]);
    rows.push([]);
    rows.push(['Nutrient', 'Level', 'Unit', 'Minimum', 'Maximum']);
    for (const n of r.nutrients) rows.push([n.name ?? n.id, level(n.value), n.unit ?? '', n.min ?? '', n.max ?? '']);
  } else {
    const c = payload.check;
    rows.push(['Ration check against', `${c.requirement.name} (${c.requirement.source})`, 'Animal', c.requirement.species, 'Phase', c.requirement.phase ?? '']);
    rows.push([]);
    rows.push(['Ingredient', `Amount (${unit})`, `Price (${cur}/${unit})`]);
    for (const l of c.lines) rows.push([l.name, massFromKg(l.kg, measures.unitSystem).toFixed(2), l.pricePerKg == null ? 'unknown' : pricePerMassUnit(l.pricePerKg, measures.unitSystem).toFixed(4)]);
    rows.push([]);
    rows.push(['Finding', 'Nutrient', 'Level', 'Unit', 'Minimum', 'Maximum', 'In words']);
    for (const f of c.result.findings) rows.push([f.kind, f.name, f.value == null ? '' : level(f.value), f.unit, f.min ?? '', f.max ?? '', f.text]);
    for (const corr of c.result.corrections) rows.push(['correction', corr.mode, '', '', '', '', corr.text.join(' ')]);
  }
  return Papa.unparse(rows, { newline: '\r\n' });
}

async function organizationName(db: Db, id: number): Promise<string> {
  const [o] = await db.select({ name: organizations.name }).from(organizations).where(eq(organizations.id, id));
  return o?.name ?? '';
}

async function summaryOf(db: Db, row: ShareRow): Promise<ShareSummary> {
  return {
    token: row.token,
    kind: row.kind,
    title: row.title,
    note: row.note,
    fromOrganization: await organizationName(db, row.fromOrganizationId),
    toOrganization: await organizationName(db, row.toOrganizationId),
    sharedBy: row.sharedByName,
    sharedAt: row.createdAt.toISOString(),
  };
}

/**
 * Shares a formula version of the caller's organization, or a ration check, with a farm the caller
 * belongs to: a read-only copy is kept and each other member of the farm gets an e-mail with the link
 * and the CSV. If the mail cannot be sent, the share is removed again and the error says so.
 */
export async function createShare(
  db: Db,
  mailer: Mailer,
  who: { organizationId: number; userId: string },
  input: CreateInput,
  baseUrl: string,
): Promise<ShareCreated> {
  // Another organization's formula answers 404 before anything else is looked at.
  const v = input.kind === 'formula_version' ? await getVersion(db, who.organizationId, input.formulaId, input.versionId) : null;
  const archival = v ? await formulaArchival(db, who.organizationId, v.formulaId) : null;
  if (archival) throw new HttpError(409, 'archived', `archived: restore it first. “${archival.name}” was archived by ${archival.by} on ${archival.on}; a retired formula is not sent to farms. Links already sent keep working.`);
  const target = (await shareTargets(db, who.userId)).find((t) => t.id === input.toOrganizationId);
  if (!target) throw badRequest('toOrganizationId: you can share only with a farm you are a member of', { toOrganizationId: ['choose one of the farms you belong to (a farm adds you by invitation)'] });
  const farmMeasures = await getMeasures(db, target.id);
  let payload: SharedPayload;
  let title: string;
  if (v) {
    const { snapshot, ...version } = v;
    payload = { kind: 'formula_version', formulaName: snapshot.formulaName, version, snapshot, measures: farmMeasures };
    title = `${snapshot.formulaName}, version ${v.number}`;
  } else if (input.kind === 'ration_check') {
    const check = await runRationCheck(db, who.organizationId, input.check, farmMeasures);
    payload = { kind: 'ration_check', check };
    title = `Ration check: ${check.requirement.name}`;
  } else {
    throw badRequest('kind: choose what to share');
  }
  const recipients = (
    await db
      .select({ email: users.email })
      .from(memberships)
      .innerJoin(users, eq(users.id, memberships.userId))
      .where(and(eq(memberships.organizationId, target.id), ne(memberships.userId, who.userId)))
  ).map((r) => r.email);
  if (recipients.length === 0) throw badRequest(`toOrganizationId: ${target.name} has no other member to send it to`, { toOrganizationId: [`${target.name} has no other member yet: invite the farm’s people first`] });
  const [sharer] = await db.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, who.userId));
  const token = randomBytes(18).toString('base64url');
  const [{ id }] = await db
    .insert(shares)
    .values({
      token,
      fromOrganizationId: who.organizationId,
      toOrganizationId: target.id,
      kind: input.kind,
      title: title.slice(0, 200),
      note: input.note || null,
      payload,
      sharedByUserId: who.userId,
      sharedByName: sharer?.name || sharer?.email || 'unknown',
      recipients,
    })
    .$returningId();
  const [row] = await db.select().from(shares).where(eq(shares.id, id));
  const summary = await summaryOf(db, row);
  const link = `${baseUrl.replace(/\/$/, '')}/shared/${token}`;
  const csv = shareCsv(payload, farmMeasures);
  try {
    for (const to of recipients) {
      await mailer.send(sharedResultMail({ to, sharerName: summary.sharedBy, fromOrganization: summary.fromOrganization, farmName: target.name, title: summary.title, note: summary.note, link, csv, csvName: `troughline-shared-${token.slice(0, 8)}.csv` }));
    }
  } catch (error) {
    await db.delete(shares).where(eq(shares.id, id));
    if (error instanceof HttpError) throw error;
    throw new HttpError(502, 'mail_failed', 'The e-mail could not be sent, so nothing was shared. Try again later.');
  }
  return { ...summary, recipients, link };
}

/**
 * A share the user may read: they are a member (any role) of the receiving organization, whichever
 * organization is active in their session. Anyone else gets 404, as for any other organization's row.
 */
async function findReadable(db: Db, userId: string, token: string): Promise<ShareRow> {
  const [row] = await db.select().from(shares).where(eq(shares.token, token));
  const [member] = row ? await db.select({ id: memberships.id }).from(memberships).where(and(eq(memberships.userId, userId), eq(memberships.organizationId, row.toOrganizationId))) : [];
  if (!row || !member) throw notFound('shared result', token);
  return row;
}

/** A shared result, in the receiving organization's units and currency. */
export async function getShare(db: Db, userId: string, token: string): Promise<ShareDetail> {
  const row = await findReadable(db, userId, token);
  return { ...(await summaryOf(db, row)), payload: row.payload, measures: await getMeasures(db, row.toOrganizationId) };
}

export async function getShareCsv(db: Db, userId: string, token: string): Promise<{ csv: string; filename: string }> {
  const row = await findReadable(db, userId, token);
  return { csv: shareCsv(row.payload, await getMeasures(db, row.toOrganizationId)), filename: `troughline-shared-${token.slice(0, 8)}.csv` };
}

/** What was shared with this organization, newest first. */
export async function listReceived(db: Db, organizationId: number): Promise<ShareSummary[]> {
  const rows = await db.select().from(shares).where(eq(shares.toOrganizationId, organizationId)).orderBy(desc(shares.createdAt), desc(shares.id)).limit(100);
  const names = new Map((rows.length ? await db.select().from(organizations).where(inArray(organizations.id, [...new Set(rows.flatMap((r) => [r.fromOrganizationId, r.toOrganizationId]))])) : []).map((o) => [o.id, o.name]));
  return rows.map((r) => ({ token: r.token, kind: r.kind, title: r.title, note: r.note, fromOrganization: names.get(r.fromOrganizationId) ?? '', toOrganization: names.get(r.toOrganizationId) ?? '', sharedBy: r.sharedByName, sharedAt: r.createdAt.toISOString() }));
}
