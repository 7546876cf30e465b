// Picking a job's kit: the pick list in bin order, scans applied once each by their device-made
// id, pause and resume by anyone in the warehouse, and completion issuing the stock in one
// transaction (ledger pick-issue movements, reservations consumed, serials attached, job ready).
import type { MailService } from './mail.ts';
import { pgCode, pgConstraint, isUuid } from '../db/errors.ts';
import { eq, sql } from 'drizzle-orm';
import type { Db, DbOrTx, Tx } from '../db/client.ts';
import { jobs, jobStatusHistory, partSerials, pickScans, pickSessions, reservations } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { assertCanSeeCompany } from '../policies/company-scope.ts';
import { can } from '@shared/roles.ts';
import { ConflictError, NotFoundError } from '../errors.ts';
import type { JobStatus } from '@shared/contracts/jobs.ts';
import { SerialSchema, type PickScanInput, type PickScanResult, type PickState } from '@shared/contracts/warehouse.ts';
import { isSerialised, lithiumHeadline, lithiumShort, readScan } from '@shared/domain/warehouse.ts';
import { changeReserved, inStockTransaction, lockPartLevels, recordMovement } from './ledger.ts';

export interface PickingDeps {
  db: Db;
  now?: () => Date;
  /** Tells the customer the kit is ready, in the transaction that makes it so. */
  mail?: Pick<MailService, 'jobStatusChanged'>;
}

/** Statuses a job can be picked in. */
const PICKABLE: JobStatus[] = ['reserved', 'picking'];
/** Statuses after a completed pick: completing again changes nothing. */
const PICKED: JobStatus[] = ['ready', 'dispatched', 'collected', 'closed'];

export interface PickPlace {
  warehouse: string;
  warehouseName: string;
  warehouseRank: number;
  bin: string;
  binOrder: number;
  qty: number;
  needsTransfer: boolean;
}
export interface LoadedLine {
  lineId: string;
  lineNo: number;
  partId: string;
  sku: string;
  name: string;
  gtin: string | null;
  category: string;
  qty: number;
  picked: number;
  serialised: boolean;
  serials: string[];
  lithium: string | null;
  /** The short form for labels. */
  lithiumShort: string | null;
  massKg: number;
  places: PickPlace[];
}

/** Everything about a job's pick in four queries: the job, its lines with places, its scans, its session. */
export async function loadPick(q: DbOrTx, jobId: string) {
  const [job] = (
    await q.execute<{ id: string; reference: string; status: JobStatus; company_id: string; company: string; site_suburb: string | null; site_postcode: string | null; contact: string | null; notes: string | null; ordered_at: Date | null; created_at: Date }>(sql`
      select j.id, j.reference, j.status, j.company_id, c.name as company, j.site_suburb, j.site_postcode, j.contact, j.notes, j.ordered_at, j.created_at
      from jobs j join companies c on c.id = j.company_id where j.id = ${jobId}`)
  ).rows;
  if (!job) return null;
  const lineRows = (
    await q.execute<{ id: string; line_no: number; qty: number; part_id: string; sku: string; name: string; gtin14: string | null; category: string; un_number: string | null; dg_class: string | null; wh_rating: number | null; mass_kg: number }>(sql`
      select jl.id, jl.line_no, jl.qty, p.id as part_id, p.sku, p.name, p.gtin14, p.category, p.un_number, p.dg_class, p.wh_rating::float8 as wh_rating, p.mass_kg::float8 as mass_kg
      from job_lines jl join parts p on p.id = jl.part_id where jl.job_id = ${jobId} order by jl.line_no`)
  ).rows;
  // Where each line's units are: held bins before the pick completes, the bins they were issued from after.
  const placeRows = (
    await q.execute<{ line_id: string; part_id: string; warehouse: string; warehouse_name: string; rank: number; bin: string; pick_order: number | null; qty: number; needs_transfer: boolean }>(sql`
      select r.job_line_id as line_id, r.part_id, w.code as warehouse, w.name as warehouse_name, w.rank, r.bin, b.pick_order, r.qty, r.needs_transfer
      from reservations r join job_lines jl on jl.id = r.job_line_id join warehouses w on w.id = r.warehouse_id
      left join bins b on b.warehouse_id = r.warehouse_id and b.code = r.bin
      where jl.job_id = ${jobId}
      union all
      select null, m.part_id, w.code, w.name, w.rank, m.bin, b.pick_order, -sum(m.qty)::int, false
      from stock_movements m join warehouses w on w.id = m.warehouse_id
      left join bins b on b.warehouse_id = m.warehouse_id and b.code = m.bin
      where m.job_id = ${jobId} and m.kind = 'pick-issue'
      group by m.part_id, w.code, w.name, w.rank, m.bin, b.pick_order`)
  ).rows;
  const scans = (
    await q.execute<{ id: number; scan_id: string; code: string; job_line_id: string; qty: number; serial: string | null; at: Date; by: string | null }>(sql`
      select s.id, s.scan_id, s.code, s.job_line_id, s.qty, s.serial, s.at, u.name as by from pick_scans s left join "user" u on u.id = s.user_id where s.job_id = ${jobId} order by s.id`)
  ).rows;
  const [session] = (
    await q.execute<{ state: 'active' | 'paused' | 'done'; picker: string | null; picker_id: string | null; paused_at: Date | null; current_line_id: string | null }>(sql`
      select s.state, u.name as picker, s.picker_id, s.paused_at, s.current_line_id from pick_sessions s left join "user" u on u.id = s.picker_id where s.job_id = ${jobId}`)
  ).rows;

  const lines: LoadedLine[] = lineRows.map((l) => {
    const own = scans.filter((s) => s.job_line_id === l.id);
    return {
      lineId: l.id,
      lineNo: l.line_no,
      partId: l.part_id,
      sku: l.sku,
      name: l.name,
      gtin: l.gtin14,
      category: l.category,
      qty: l.qty,
      picked: own.reduce((n, s) => n + s.qty, 0),
      serialised: isSerialised(l.category),
      serials: own.filter((s) => s.serial).map((s) => s.serial!),
      lithium: l.un_number ? lithiumHeadline({ unNumber: l.un_number, dgClass: l.dg_class, whRating: l.wh_rating }) : null,
      lithiumShort: l.un_number ? lithiumShort({ unNumber: l.un_number, dgClass: l.dg_class, whRating: l.wh_rating }) : null,
      massKg: l.mass_kg,
      places: [],
    };
  });
  for (const p of placeRows) {
    // Issued movements name the part, not the line: they go to the part's first line.
    const line = p.line_id ? lines.find((l) => l.lineId === p.line_id) : lines.find((l) => l.partId === p.part_id);
    if (line && p.qty > 0) line.places.push({ warehouse: p.warehouse, warehouseName: p.warehouse_name, warehouseRank: p.rank, bin: p.bin, binOrder: p.pick_order ?? 1_000_000, qty: p.qty, needsTransfer: p.needs_transfer });
  }
  for (const l of lines) l.places.sort((a, b) => a.warehouseRank - b.warehouseRank || a.binOrder - b.binOrder || a.bin.localeCompare(b.bin));
  const state: PickState = session?.state ?? (PICKED.includes(job.status) ? 'done' : 'waiting');
  return { job, lines, scans, session: session ?? null, state };
}
export type LoadedPick = NonNullable<Awaited<ReturnType<typeof loadPick>>>;

export function progressOf(lines: LoadedLine[]) {
  return {
    units: lines.reduce((n, l) => n + l.qty, 0),
    picked: lines.reduce((n, l) => n + Math.min(l.picked, l.qty), 0),
    lines: lines.length,
    linesDone: lines.filter((l) => l.picked >= l.qty).length,
  };
}

function lineView(l: LoadedLine) {
  return { lineId: l.lineId, sku: l.sku, name: l.name, qty: l.qty, picked: l.picked, serialised: l.serialised, serials: l.serials };
}

/** What the picker should scan next, in walking order: "QRB-M1 in A-03". */
function nextExpected(lines: LoadedLine[]) {
  const open = lines.filter((l) => l.picked < l.qty);
  if (open.length === 0) return 'nothing more: every line is picked; complete the pick.';
  return open
    .slice(0, 3)
    .map((l) => `${l.sku}${l.places[0] ? ` from ${l.places[0].warehouse} ${l.places[0].bin}` : ''} (${l.qty - l.picked} to go)`)
    .join('; ');
}

/** The job's pick as the actor may see it: another company's job (or no job) is "not found". */
export async function visiblePick(q: DbOrTx, actor: Actor, jobId: string) {
  if (!isUuid(jobId)) throw new NotFoundError('That job');
  const pick = await loadPick(q, jobId);
  if (!pick) throw new NotFoundError('That job');
  assertCanSeeCompany(actor, pick.job.company_id, 'That job');
  return pick;
}

export function createPickingService({ db, now = () => new Date(), mail }: PickingDeps) {
  const visible = (actor: Actor, jobId: string, q: DbOrTx = db) => visiblePick(q, actor, jobId);

  async function lockJob(tx: Tx, jobId: string) {
    await tx.execute(sql`select id from jobs where id = ${jobId} for update`);
  }

  async function setStatus(tx: Tx, jobId: string, status: JobStatus, userId: string, note: string | null = null) {
    const at = now();
    await tx.update(jobs).set({ status, updatedAt: at }).where(eq(jobs.id, jobId));
    await tx.insert(jobStatusHistory).values({ jobId, status, userId, note, at });
  }

  function listView(actor: Actor, pick: LoadedPick) {
    const groups = new Map<string, { warehouse: string; warehouseName: string; rank: number; order: number; lines: (LoadedLine & { order: number })[] }>();
    for (const l of pick.lines) {
      const first = l.places[0];
      const key = first?.warehouse ?? '—';
      const g = groups.get(key) ?? { warehouse: key, warehouseName: first?.warehouseName ?? 'Not held in any bin', rank: first?.warehouseRank ?? 1_000, order: 0, lines: [] };
      g.lines.push({ ...l, order: first?.binOrder ?? 1_000_000 });
      groups.set(key, g);
    }
    const current = pick.session?.current_line_id ? pick.lines.find((l) => l.lineId === pick.session!.current_line_id) : undefined;
    const pickable = PICKABLE.includes(pick.job.status);
    const progress = progressOf(pick.lines);
    return {
      job: { id: pick.job.id, reference: pick.job.reference, status: pick.job.status, company: pick.job.company, siteSuburb: pick.job.site_suburb, sitePostcode: pick.job.site_postcode, notes: pick.job.notes },
      state: pick.state,
      picker: pick.session?.picker ?? null,
      pausedAt: pick.session?.paused_at ? new Date(pick.session.paused_at).toISOString() : null,
      progress,
      groups: [...groups.values()]
        .sort((a, b) => a.rank - b.rank || a.warehouse.localeCompare(b.warehouse))
        .map((g) => ({
          warehouse: g.warehouse,
          warehouseName: g.warehouseName,
          lines: g.lines
            .sort((a, b) => a.order - b.order || a.lineNo - b.lineNo)
            .map((l) => ({ lineId: l.lineId, lineNo: l.lineNo, sku: l.sku, name: l.name, gtin: l.gtin, qty: l.qty, picked: l.picked, serialised: l.serialised, serials: l.serials, lithium: l.lithium, places: l.places.map((p) => ({ warehouse: p.warehouse, bin: p.bin, binOrder: p.binOrder, qty: p.qty, needsTransfer: p.needsTransfer })) })),
        })),
      current: current && current.picked < current.qty ? { lineId: current.lineId, sku: current.sku, toGo: current.qty - current.picked } : null,
      recent: pick.scans
        .slice(-8)
        .reverse()
        .map((s) => ({ scanId: s.scan_id, code: s.code, sku: pick.lines.find((l) => l.lineId === s.job_line_id)?.sku ?? '', serial: s.serial, qty: s.qty, at: new Date(s.at).toISOString(), by: s.by })),
      abilities: {
        scan: can(actor.role, 'jobs.pick') && pickable && pick.state !== 'paused',
        pause: can(actor.role, 'jobs.pick') && pick.job.status === 'picking' && pick.state === 'active',
        resume: can(actor.role, 'jobs.pick') && pick.job.status === 'picking' && pick.state === 'paused',
        complete: can(actor.role, 'jobs.pick') && pick.job.status === 'picking' && pick.state === 'active' && progress.picked === progress.units && progress.units > 0,
      },
    };
  }

  /** Who has the serial already: an issued unit of the same part, or a scan on another open pick. */
  async function serialTaken(tx: Tx, partId: string, serial: string, jobId: string) {
    const [issued] = (await tx.execute<{ reference: string }>(sql`select j.reference from part_serials s join jobs j on j.id = s.job_id where s.part_id = ${partId} and upper(s.serial) = upper(${serial}) and s.state = 'issued'`)).rows;
    if (issued) return `already issued to job ${issued.reference}`;
    const [scanned] = (
      await tx.execute<{ reference: string; job_id: string }>(sql`
        select j.reference, j.id as job_id from pick_scans s join job_lines jl on jl.id = s.job_line_id join jobs j on j.id = s.job_id
        where jl.part_id = ${partId} and upper(s.serial) = upper(${serial}) limit 1`)
    ).rows;
    if (scanned) return scanned.job_id === jobId ? 'already scanned on this pick' : `already scanned for job ${scanned.reference}`;
    return null;
  }

  return {
    /** The pick queue: jobs ready to pick or being picked, oldest order first, with who is on each. */
    async queue(actor: Actor) {
      authorize(actor, 'stock.view');
      const rows = await db.execute<{ id: string; reference: string; status: JobStatus; company: string; site_suburb: string | null; ordered_at: Date | null; lines: number; units: number; picked: number; state: string | null; picker: string | null }>(sql`
        select j.id, j.reference, j.status, c.name as company, j.site_suburb, j.ordered_at,
          (select count(*) from job_lines jl where jl.job_id = j.id)::int as lines,
          (select coalesce(sum(jl.qty), 0) from job_lines jl where jl.job_id = j.id)::int as units,
          (select coalesce(sum(s.qty), 0) from pick_scans s where s.job_id = j.id)::int as picked,
          ps.state, u.name as picker
        from jobs j join companies c on c.id = j.company_id
        left join pick_sessions ps on ps.job_id = j.id left join "user" u on u.id = ps.picker_id
        where j.status in ('reserved', 'picking')
        order by coalesce(j.ordered_at, j.created_at), j.reference`);
      return rows.rows.map((r) => ({ id: r.id, reference: r.reference, status: r.status, company: r.company, siteSuburb: r.site_suburb, orderedAt: r.ordered_at ? new Date(r.ordered_at).toISOString() : null, lines: r.lines, units: r.units, picked: r.picked, state: (r.state ?? 'waiting') as PickState, picker: r.picker }));
    },

    async pickList(actor: Actor, jobId: string) {
      authorize(actor, 'stock.view');
      return listView(actor, await visible(actor, jobId));
    },

    /**
     * One scan. Refusals (wrong part, serial already issued, serial on a counted part, over-pick,
     * unknown barcode) change nothing and say what was expected. A scan id seen before answers
     * as it did, without applying the scan again.
     */
    async scan(actor: Actor, jobId: string, input: PickScanInput, retried = false): Promise<PickScanResult> {
      authorize(actor, 'jobs.pick');
      await visible(actor, jobId);
      try {
        return await db.transaction(async (tx) => {
          await lockJob(tx, jobId);
          const pick = (await loadPick(tx, jobId))!;
          const progress = () => progressOf(pick.lines);
          const seen = pick.scans.find((s) => s.scan_id === input.scanId);
          if (seen) {
            const line = pick.lines.find((l) => l.lineId === seen.job_line_id)!;
            return { accepted: true, replay: true, message: `Already counted: ${seen.serial ? `serial ${seen.serial} of ` : `${seen.qty} × `}${line.sku}.`, line: lineView(line), progress: progress() };
          }
          if (!PICKABLE.includes(pick.job.status)) throw new ConflictError(`This job is ${pick.job.status}; only a reserved job can be picked.`);
          const refuse = (message: string, expected = nextExpected(pick.lines)) => ({ accepted: false, replay: false, message, expected, progress: progress() });
          if (pick.session?.state === 'paused') return refuse(`This pick is paused${pick.session.picker ? ` by ${pick.session.picker}` : ''}. Resume it to carry on.`, 'Resume the pick first.');

          const reading = readScan(input.code);
          let partId: string | null = null;
          let serial: string | null = null;
          if (reading.kind === 'gs1' && reading.sscc && !reading.gtin14) return refuse(`That is a parcel label (SSCC ${reading.sscc}), not a part.`);
          if (reading.kind === 'gs1' && !reading.gtin14) return refuse('That GS1 barcode names no part (it has no GTIN, AI 01). Scan the part’s own label.');
          if (reading.kind === 'gs1' || reading.kind === 'gtin') {
            const [p] = (await tx.execute<{ id: string }>(sql`select id from parts where gtin14 = ${reading.gtin14}`)).rows;
            if (!p) return refuse(`Unknown barcode: no part has GTIN ${reading.gtin14}.`);
            partId = p.id;
            if (reading.kind === 'gs1') serial = reading.serial;
          } else {
            const [p] = (await tx.execute<{ id: string }>(sql`select id from parts where sku = upper(${reading.text})`)).rows;
            partId = p?.id ?? null;
          }

          let line: LoadedLine | undefined;
          if (partId) {
            const ofPart = pick.lines.filter((l) => l.partId === partId);
            if (ofPart.length === 0) {
              const [p] = (await tx.execute<{ sku: string }>(sql`select sku from parts where id = ${partId}`)).rows;
              return refuse(`Wrong part: ${p!.sku} is not on this job.`);
            }
            line = ofPart.find((l) => l.picked < l.qty);
            if (!line) return refuse(`Over-pick: every ${ofPart[0]!.sku} this job needs (${ofPart.reduce((n, l) => n + l.qty, 0)}) is already picked.`);
            if (!line.serialised && serial) return refuse(`${line.sku} is not serialised: it is counted, not scanned by serial. Scan its label or SKU and key the quantity.`, `${line.sku} without a serial`);
            if (line.serialised && !serial) {
              if ((input.qty ?? 1) > 1) return refuse(`${line.sku} is serialised: scan each unit’s serial instead of a quantity.`, `the serial of each ${line.sku}`);
              await tx.update(pickSessions).set({ currentLineId: line.lineId, updatedAt: now() }).where(eq(pickSessions.jobId, jobId));
              if (!pick.session) await start(tx, pick, actor, line.lineId);
              return { accepted: true, replay: false, message: `${line.sku}: now scan the serial of each unit (${line.qty - line.picked} to go).`, line: lineView(line), progress: progress() };
            }
          } else {
            // Not a part: a serial for the serialised line the last part scan named, or nothing we know.
            line = pick.session?.current_line_id ? pick.lines.find((l) => l.lineId === pick.session!.current_line_id && l.picked < l.qty) : undefined;
            if (!line) return refuse(`Unknown barcode “${input.code.trim()}”: it is not a part on this job or a serial we are waiting for.`);
            if (!SerialSchema.safeParse(reading.kind === 'text' ? reading.text : '').success) return refuse(`“${input.code.trim()}” does not look like a serial (1–20 letters, digits, dots, dashes or slashes).`, `the serial of a ${line.sku}`);
            serial = reading.kind === 'text' ? reading.text : null;
          }

          const qty = serial ? 1 : (input.qty ?? 1);
          if (serial && (input.qty ?? 1) > 1) return refuse('A serial counts one unit: leave the quantity at 1.', `the serial of a ${line.sku}`);
          if (line.picked + qty > line.qty) return refuse(`Over-pick: line ${line.lineNo} needs ${line.qty} × ${line.sku} and ${line.picked} are picked; at most ${line.qty - line.picked} more.`);
          if (serial) {
            const taken = await serialTaken(tx, line.partId, serial, jobId);
            if (taken) return refuse(`Serial ${serial} of ${line.sku} is ${taken}.`, `another unit’s serial for ${line.sku}`);
          }
          if (!pick.session) await start(tx, pick, actor, null);
          else if (pick.job.status === 'reserved') await setStatus(tx, jobId, 'picking', actor.userId, 'Picking started');
          const message = serial ? `Serial ${serial} of ${line.sku} captured (${line.picked + 1} of ${line.qty}).` : `${qty} × ${line.sku} picked (${line.picked + qty} of ${line.qty}).`;
          await tx.insert(pickScans).values({ jobId, scanId: input.scanId, code: input.code.trim(), jobLineId: line.lineId, qty, serial, message, userId: actor.userId, at: now() });
          line.picked += qty;
          if (serial) line.serials.push(serial);
          const stillCurrent = line.serialised && line.picked < line.qty ? line.lineId : null;
          await tx.update(pickSessions).set({ currentLineId: stillCurrent, pickerId: actor.userId, updatedAt: now() }).where(eq(pickSessions.jobId, jobId));
          return { accepted: true, replay: false, message, line: lineView(line), progress: progress() };
        });
      } catch (e) {
        // Two arrivals of one scan id (or one serial) at once: the unique key stopped the second.
        // Asked again, it finds the first one's row and answers as a replay or a refusal; once.
        if (!retried && pgCode(e) === '23505' && ['pick_scans_job_scan', 'pick_scans_job_line_serial'].includes(pgConstraint(e) ?? '')) return this.scan(actor, jobId, input, true);
        throw e;
      }
    },

    async pause(actor: Actor, jobId: string) {
      authorize(actor, 'jobs.pick');
      await visible(actor, jobId);
      await db.transaction(async (tx) => {
        await lockJob(tx, jobId);
        const pick = (await loadPick(tx, jobId))!;
        if (pick.job.status !== 'picking' || pick.session?.state !== 'active') throw new ConflictError('Only a pick under way can be paused.');
        await tx.update(pickSessions).set({ state: 'paused', pausedAt: now(), currentLineId: null, updatedAt: now() }).where(eq(pickSessions.jobId, jobId));
        await tx.insert(jobStatusHistory).values({ jobId, status: 'picking', userId: actor.userId, note: 'Pick paused', at: now() });
      });
      return this.pickList(actor, jobId);
    },

    /** Anyone in the warehouse may resume a paused pick; they become its picker. */
    async resume(actor: Actor, jobId: string) {
      authorize(actor, 'jobs.pick');
      await visible(actor, jobId);
      await db.transaction(async (tx) => {
        await lockJob(tx, jobId);
        const pick = (await loadPick(tx, jobId))!;
        if (pick.job.status !== 'picking' || pick.session?.state !== 'paused') throw new ConflictError('This pick is not paused.');
        await tx.update(pickSessions).set({ state: 'active', pausedAt: null, pickerId: actor.userId, updatedAt: now() }).where(eq(pickSessions.jobId, jobId));
        await tx.insert(jobStatusHistory).values({ jobId, status: 'picking', userId: actor.userId, note: `Pick resumed by ${actor.name}`, at: now() });
      });
      return this.pickList(actor, jobId);
    },

    /**
     * Issues the picked kit in one transaction: a pick-issue movement per held bin, the holds
     * consumed, each scanned serial issued to its line, the job ready. A second call finds the job
     * ready and issues nothing.
     */
    async complete(actor: Actor, jobId: string) {
      authorize(actor, 'jobs.pick');
      const before = await visible(actor, jobId);
      if (PICKED.includes(before.job.status)) return { status: before.job.status, issued: 0, serials: 0, alreadyComplete: true };
      return inStockTransaction(db, async (tx) => {
        await lockPartLevels(tx, [...new Set(before.lines.map((l) => l.partId))]);
        await lockJob(tx, jobId);
        const pick = (await loadPick(tx, jobId))!;
        if (PICKED.includes(pick.job.status)) return { status: pick.job.status, issued: 0, serials: 0, alreadyComplete: true };
        if (pick.job.status !== 'picking') throw new ConflictError(`This job is ${pick.job.status}: scan its lines before completing the pick.`);
        if (pick.session?.state === 'paused') throw new ConflictError('This pick is paused: resume it first.');
        const open = pick.lines.filter((l) => l.picked < l.qty);
        if (open.length) throw new ConflictError(`Not everything is picked yet: ${open.map((l) => `${l.sku} ${l.picked} of ${l.qty}`).join(', ')}.`, { open: open.map((l) => l.sku) });
        const unheld = pick.lines.filter((l) => l.places.reduce((n, p) => n + p.qty, 0) < l.qty);
        if (unheld.length) throw new ConflictError(`Some lines are not fully reserved: ${unheld.map((l) => l.sku).join(', ')}. Reserve them before completing.`);
        const at = now();
        const held = await tx.select().from(reservations).where(sql`${reservations.jobLineId} in (select id from job_lines where job_id = ${jobId})`);
        let issued = 0;
        for (const r of held) {
          const key = { partId: r.partId, warehouseId: r.warehouseId, bin: r.bin };
          await changeReserved(tx, key, -r.qty);
          await recordMovement(tx, { ...key, qty: -r.qty, kind: 'pick-issue', reference: pick.job.reference, jobId, userId: actor.userId, reason: 'Picked for the job' });
          await tx.delete(reservations).where(eq(reservations.id, r.id));
          issued += r.qty;
        }
        let serials = 0;
        for (const l of pick.lines)
          for (const s of l.serials) {
            const done = await tx
              .insert(partSerials)
              .values({ partId: l.partId, serial: s, state: 'issued', jobId, jobLineId: l.lineId, issuedAt: at, issuedBy: actor.userId })
              .onConflictDoUpdate({ target: [partSerials.partId, partSerials.serial], set: { state: 'issued', jobId, jobLineId: l.lineId, issuedAt: at, issuedBy: actor.userId }, setWhere: sql`${partSerials.state} = 'in-stock'` })
              .returning({ id: partSerials.id });
            if (done.length === 0) throw new ConflictError(`Serial ${s} of ${l.sku} has already been issued to another job.`);
            serials++;
          }
        await tx.update(pickSessions).set({ state: 'done', completedAt: at, completedBy: actor.userId, currentLineId: null, updatedAt: at }).where(eq(pickSessions.jobId, jobId));
        await setStatus(tx, jobId, 'ready', actor.userId, `Picked: ${issued} units issued${serials ? `, ${serials} serials` : ''}`);
        await mail?.jobStatusChanged(tx, jobId, 'ready');
        return { status: 'ready' as JobStatus, issued, serials, alreadyComplete: false };
      });
    },
  };

  async function start(tx: Tx, pick: LoadedPick, actor: Actor, currentLineId: string | null) {
    await tx.insert(pickSessions).values({ jobId: pick.job.id, state: 'active', pickerId: actor.userId, currentLineId, startedAt: now(), updatedAt: now() });
    if (pick.job.status === 'reserved') await setStatus(tx, pick.job.id, 'picking', actor.userId, 'Picking started');
  }
}

export type PickingService = ReturnType<typeof createPickingService>;
