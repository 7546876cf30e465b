// Labels for a job's kit and the handover sheet: what is printed, and exactly what each barcode
// encodes. Pick labels per line (per unit for serialised parts); kit labels per parcel with an
// SSCC from the database sequence and a QR code to the job's page.
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client.ts';
import { jobParcels, settings, ssccSerialSequence } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError, NotFoundError } from '../errors.ts';
import type { JobStatus } from '@shared/contracts/jobs.ts';
import type { LabelKind, Symbology } from '@shared/contracts/warehouse.ts';
import { makeSscc } from '@shared/domain/gtin.ts';
import { gs1ElementString, gs1FieldProblem, gs1HumanReadable, type Gs1Field } from '@shared/domain/gs1.ts';
import { INSTALLATION_CAUTIONS, LITHIUM_REMINDERS } from '@shared/domain/warehouse.ts';
import type { PlannerService } from './planner.ts';
import { visiblePick, type LoadedLine } from './picking.ts';

/** GS1's own documentation company prefix (the one its worked examples use): the demo's setting. */
export const DOCUMENTATION_COMPANY_PREFIX = '0614141';
export const COMPANY_PREFIX_SETTING = 'gs1.companyPrefix';

export interface LabelsDeps {
  db: Db;
  planner: Pick<PlannerService, 'savedFigures'>;
  /** The site's own address, for the QR code to a job's page. */
  publicUrl: string;
  now?: () => Date;
}

export interface BuiltLabel {
  n: number;
  kind: LabelKind;
  lines: string[];
  text: string;
  payload: string;
  symbology: Symbology;
  bwipText: string;
  qr: { payload: string } | null;
  lithium: boolean;
}

const LABELLED: JobStatus[] = ['reserved', 'part-reserved', 'picking', 'ready', 'dispatched', 'collected', 'closed'];

/**
 * The installer's order reference for AI (400): the job reference up to its first space (trade
 * references lead with the customer's own number, "BG-2041 Fern St"), when GS1 can carry it.
 */
export function orderReferenceOf(jobReference: string): string | null {
  const head = jobReference.trim().split(/\s+/)[0] ?? '';
  // A number, not a word: letters, digits and dashes with at least one digit.
  return /^[A-Za-z0-9][A-Za-z0-9./-]*$/.test(head) && /\d/.test(head) && gs1FieldProblem({ ai: '400', value: head }) === null ? head : null;
}

/** Parcels for a kit: each unit with cells travels on its own (heavy, dangerous goods); the rest share one. */
export function parcelCount(lines: Pick<LoadedLine, 'qty' | 'lithium'>[]) {
  const cells = lines.filter((l) => l.lithium).reduce((n, l) => n + l.qty, 0);
  const rest = lines.some((l) => !l.lithium) ? 1 : 0;
  return Math.max(1, cells + rest);
}

function symbolFor(gtin: string | null, extra: Gs1Field[], sku: string) {
  if (!gtin) return { symbology: 'code128' as const, payload: sku, text: sku, bwipText: sku };
  const fields: Gs1Field[] = [{ ai: '01', value: gtin }, ...extra];
  return { symbology: 'gs1-128' as const, payload: gs1ElementString(fields), text: gs1HumanReadable(fields), bwipText: gs1HumanReadable(fields) };
}

export function createLabelsService({ db, planner, publicUrl, now = () => new Date() }: LabelsDeps) {
  async function companyPrefix() {
    const [row] = await db.select().from(settings).where(eq(settings.key, COMPANY_PREFIX_SETTING));
    const value = (row?.value as { prefix?: unknown } | undefined)?.prefix;
    return typeof value === 'string' && /^\d{4,12}$/.test(value) ? value : DOCUMENTATION_COMPANY_PREFIX;
  }

  /** The job's parcels, numbered once: the first labelling takes serial references from the sequence. */
  async function parcels(jobId: string, count: number) {
    // Numbered already (every label request after the first): a plain read, no lock.
    const numbered = await db.select().from(jobParcels).where(eq(jobParcels.jobId, jobId)).orderBy(jobParcels.n);
    if (numbered.length) return numbered;
    const prefix = await companyPrefix();
    return db.transaction(async (tx) => {
      await tx.execute(sql`select id from jobs where id = ${jobId} for update`);
      const existing = await tx.select().from(jobParcels).where(eq(jobParcels.jobId, jobId)).orderBy(jobParcels.n);
      if (existing.length) return existing;
      const made = [];
      for (let n = 1; n <= count; n++) {
        const [{ ref }] = (await tx.execute<{ ref: string }>(sql`select nextval(${sql.raw(`'${ssccSerialSequence.seqName}'`)}) as ref`)).rows as [{ ref: string }];
        const serialReference = Number(ref);
        made.push({ jobId, n, of: count, serialReference, sscc: makeSscc({ extension: 0, companyPrefix: prefix, serialReference }) });
      }
      return tx.insert(jobParcels).values(made).returning();
    });
  }

  /** Every label for the job, numbered from 1: pick labels in walking order, then one kit label per parcel. */
  async function build(actor: Actor, jobId: string): Promise<BuiltLabel[]> {
    authorize(actor, 'labels.print');
    const pick = await visiblePick(db, actor, jobId);
    const { job } = pick;
    const placed = pick.lines.filter((l) => l.places.length > 0);
    if (!LABELLED.includes(job.status) || placed.length === 0)
      throw new ConflictError(`Nothing is reserved for job ${job.reference} yet, so there is nothing to label. Reserve its stock first.`);
    const order = orderReferenceOf(job.reference);
    const orderField: Gs1Field[] = order ? [{ ai: '400', value: order }] : [];
    const labels: Omit<BuiltLabel, 'n'>[] = [];
    const walk = [...placed].sort((a, b) => a.places[0]!.warehouseRank - b.places[0]!.warehouseRank || a.places[0]!.binOrder - b.places[0]!.binOrder || a.lineNo - b.lineNo);
    for (const l of walk) {
      const where = l.places.map((p) => `${p.warehouse} ${p.bin}`).join(', ');
      const head = (qty: string) => [`${l.sku}  ·  ${qty}`, l.name, `Bin ${where}  ·  Job ${job.reference}`];
      const dg = l.lithiumShort ? [`${l.lithiumShort} · ${LITHIUM_REMINDERS[0]}`] : [];
      if (l.serialised) {
        for (let u = 0; u < l.qty; u++) {
          const serial = l.serials[u] ?? null;
          const sym = symbolFor(l.gtin, [...(serial ? [{ ai: '21' as const, value: serial }] : []), ...orderField], l.sku);
          labels.push({ kind: 'unit', lines: [...head(`unit ${u + 1} of ${l.qty}`), serial ? `Serial ${serial}` : 'Serial: scan at picking', ...dg], ...sym, qr: null, lithium: !!l.lithium });
        }
      } else {
        const sym = symbolFor(l.gtin, orderField, l.sku);
        labels.push({ kind: 'pick', lines: [...head(`qty ${l.qty}`), ...dg], ...sym, qr: null, lithium: !!l.lithium });
      }
    }
    const kit = await parcels(jobId, parcelCount(pick.lines));
    const link = `${publicUrl.replace(/\/$/, '')}/jobs/${job.id}`;
    for (const p of kit) {
      const fields: Gs1Field[] = [{ ai: '00', value: p.sscc }];
      labels.push({
        kind: 'kit',
        lines: [`Job ${job.reference}`, job.company, `Site: ${job.site_suburb ?? '—'}${job.site_postcode ? ` ${job.site_postcode}` : ''}`, `Parcel ${p.n} of ${p.of}`],
        symbology: 'gs1-128',
        payload: gs1ElementString(fields),
        text: gs1HumanReadable(fields),
        bwipText: gs1HumanReadable(fields),
        qr: { payload: link },
        lithium: pick.lines.some((l) => l.lithium),
      });
    }
    return labels.map((l, i) => ({ ...l, n: i + 1 }));
  }

  return {
    build,

    async one(actor: Actor, jobId: string, n: number) {
      const all = await build(actor, jobId);
      const label = all.find((l) => l.n === n);
      if (!label) throw new NotFoundError(`Label ${n} of this job`);
      return label;
    },

    /** The handover sheet: the system as planned, every serial by part, the cautions. */
    async handover(actor: Actor, jobId: string) {
      authorize(actor, 'jobs.view');
      const pick = await visiblePick(db, actor, jobId);
      const { job } = pick;
      const plans = (await db.execute<{ plan_id: string }>(sql`select plan_id from job_plans where job_id = ${jobId} order by plan_id`)).rows;
      const figures = await Promise.all(plans.map(({ plan_id }) => planner.savedFigures(plan_id)));
      const systems = figures.flatMap((f) => (f ? [{ ...f, modules: f.stacks * f.modulesPerStack }] : []));
      const issued = (
        await db.execute<{ sku: string; name: string; serial: string }>(sql`
          select p.sku, p.name, s.serial from part_serials s join parts p on p.id = s.part_id
          where s.job_id = ${jobId} and s.state = 'issued' order by p.sku, s.serial`)
      ).rows;
      const serials = new Map<string, { sku: string; name: string; serials: string[] }>();
      for (const r of issued) {
        const entry = serials.get(r.sku) ?? { sku: r.sku, name: r.name, serials: [] };
        entry.serials.push(r.serial);
        serials.set(r.sku, entry);
      }
      return {
        job: { id: job.id, reference: job.reference, status: job.status, company: job.company, siteSuburb: job.site_suburb, sitePostcode: job.site_postcode, contact: job.contact },
        systems,
        serials: [...serials.values()],
        lines: pick.lines.map((l) => ({ sku: l.sku, name: l.name, qty: l.qty })),
        date: now().toISOString(),
        cautions: [...INSTALLATION_CAUTIONS],
      };
    },
  };
}

export type LabelsService = ReturnType<typeof createLabelsService>;
