import { randomUUID } from 'node:crypto';
import { In, type EntityManager } from 'typeorm';
import type { z } from 'zod';
import { convert, frameInRange, validateVin } from '@tappet/domain';
import {
  canMoveVehicle,
  defaultShopSettings,
  vehicleStatusLabels,
  vehicleStatusMoves,
  type FitmentMatch,
  type OdometerReading,
  type OdometerUnit,
  type StatusChange,
  type TimelineEntry,
  type Vehicle,
  type VehicleDetail,
  type VehicleFile,
  type VehicleFitmentResponse,
  type VehicleListResponse,
  type VehicleStatus,
  type numbersCheckInputSchema,
  type odometerInputSchema,
  type statusMoveInputSchema,
  type vehicleInputSchema,
  type vehicleListQuerySchema,
  type vehicleUpdateSchema,
} from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import { assertVehicleRoom } from '../billing/plan-limits';
import { jobTimelineEntries, vehicleCosts, vehicleHandOverBlockers } from '../jobs/jobs.service';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, forbidden, notFound } from '../../lib/http-error';
import type { AuditChanges } from '../audit/audit.entity';
import { diffChanges, recordAudit, type AuditActor } from '../audit/audit.service';
import { customerInShop } from '../customers/customers.service';
import { CustomerEntity } from '../customers/customers.entity';
import { FitmentEntity, PartEntity } from '../catalogue/catalogue.entity';
import { freeStockByPart } from '../stock/stock.queries';
import { ShopSettingsEntity } from '../settings/settings.entity';
import { UserEntity } from '../users/users.entity';
import type { FileStore } from '../uploads/file-store';
import type { PreparedUpload } from '../uploads/upload-pipeline';
import { OdometerReadingEntity, VehicleEntity, VehicleFileEntity, VehicleStatusChangeEntity, type OdometerReadingRow, type VehicleFileRow, type VehicleRow, type VehicleStatusChangeRow } from './vehicles.entity';

export type VehicleCreate = z.output<typeof vehicleInputSchema>;
export type VehiclePatch = z.output<typeof vehicleUpdateSchema>;
export type VehicleListQuery = z.output<typeof vehicleListQuerySchema>;
export type StatusMove = z.output<typeof statusMoveInputSchema>;
export type OdometerCreate = z.output<typeof odometerInputSchema>;
export type NumbersCheck = z.output<typeof numbersCheckInputSchema>;

/** Free stock per part id, with the bins holding it; parts it does not mention have none. */
export type FreeStockLookup = (shopId: string, partIds: string[]) => Promise<Map<string, { free: number; bins: string[] }>>;

/** Free stock from the stock module's ledger (issue 6): on hand less held, per bin and condition. */
export function ledgerFreeStock(db: Database): FreeStockLookup {
  return async (shopId, partIds) => {
    const summaries = await freeStockByPart(db.reader, shopId, partIds);
    return new Map([...summaries].map(([partId, s]) => [partId, { free: s.free, bins: s.lines.filter((l) => l.free > 0).map((l) => `${l.binCode} (${l.condition})`) }]));
  };
}

/** Says whether the caller may change one field of a vehicle (field-level permission). */
export type FieldPermission = (field: 'acquisitionCostMinor' | 'askingPriceMinor') => boolean;

const noSuchVehicle = () => notFound('No such vehicle in this shop.');
const noSuchFile = () => notFound('No such file for this vehicle.');

/** Readings and moves may be dated a little ahead of the server clock (a slow clock on a tablet). */
const clockSkewMs = 5 * 60_000;

const iso = (d: Date | string) => new Date(d).toISOString();

/** The outcome of the VIN check for a record: what to store. */
interface VinDecision {
  acknowledged: boolean;
}

/**
 * Checks a VIN as the rules of issue 9 ask: a 17-character VIN must carry the check digit of
 * 49 CFR 565 in position 9; a failure is refused with a warning unless `acknowledge` is set, and
 * is then kept with a record of who confirmed it. Shorter identifiers are not checked (vehicles
 * before 1981 have no standard VIN). I, O and Q never get here: the contract refuses them.
 */
export function decideVin(vin: string | null, acknowledge: boolean): VinDecision {
  if (vin === null || vin.length !== 17) return { acknowledged: false };
  const result = validateVin(vin);
  if (result.ok) return { acknowledged: false };
  if (result.reason === 'check_digit') {
    if (acknowledge) return { acknowledged: true };
    throw new HttpError(
      400,
      'validation_failed',
      `The check digit of this VIN does not match: position 9 should be ${result.expected ?? '?'}. Vehicles built for North America must carry a valid check digit. Check the VIN against the vehicle, or confirm to keep it as stamped.`,
      [{ path: ['vin'], message: `Position 9 should be ${result.expected ?? '?'} for this VIN.`, warning: 'vin_check_digit', expected: result.expected ?? null }],
    );
  }
  throw new HttpError(400, 'validation_failed', 'A VIN has letters and digits only, never I, O or Q.', [{ path: ['vin'], message: 'A VIN has letters and digits only, never I, O or Q.' }]);
}

/** Money fields only make sense for some kinds: acquisition cost for shop stock, asking price for shop stock and consignment. */
function checkMoneyForKind(row: Pick<VehicleRow, 'kind' | 'acquisitionCostMinor' | 'askingPriceMinor'>): void {
  if (row.acquisitionCostMinor !== null && row.kind !== 'shop_stock') {
    throw new HttpError(400, 'validation_failed', 'An acquisition cost is recorded for shop stock only.', [{ path: ['acquisitionCostMinor'], message: 'Only shop stock has an acquisition cost.' }]);
  }
  if (row.askingPriceMinor !== null && row.kind === 'customer') {
    throw new HttpError(400, 'validation_failed', 'An asking price is recorded for shop stock and consignments only.', [{ path: ['askingPriceMinor'], message: 'A customer’s own vehicle has no asking price here.' }]);
  }
}

/** An odometer reading expressed in another unit (exact factors of NIST SP 811: 1 mi = 1.609344 km). */
export function odometerIn(reading: { value: number; unit: OdometerUnit }, unit: OdometerUnit): number {
  return convert(reading.value, reading.unit, unit);
}

/** A date (YYYY-MM-DD) as the instant of noon UTC that day, so it reads as that day in any time zone near UTC. */
const dateAt = (day: string) => new Date(`${day}T12:00:00Z`);

/**
 * Moves a vehicle to `move.to` inside the caller's write: the allowed moves, no earlier than its
 * last move, no hand-over or sale while a safety item holds it back, then a status-change row and
 * an audit event. The vehicle screen's moves and a consignment settlement (which records the sale)
 * both come through here.
 */
export async function moveVehicleStatus(manager: EntityManager, shopId: string, vehicleId: string, move: { to: VehicleStatus; at: Date; note: string | null }, actor: AuditActor, now: Date): Promise<void> {
  const { at } = move;
  const before = await shopScoped(manager, VehicleEntity, shopId).findOne({ id: vehicleId });
  if (!before) throw noSuchVehicle();
  if (!canMoveVehicle(before.kind, before.status, move.to)) {
    const allowed = vehicleStatusMoves[before.status].filter((to) => canMoveVehicle(before.kind, before.status, to));
    throw new HttpError(
      409,
      'conflict',
      `A vehicle that is “${vehicleStatusLabels[before.status]}” cannot move to “${vehicleStatusLabels[move.to]}”. ${allowed.length ? `It can move to: ${allowed.map((s) => vehicleStatusLabels[s]).join(', ')}.` : 'Its stay has ended.'}`,
    );
  }
  if (at.getTime() < new Date(before.statusSince).getTime()) throw badRequest('The date of the move is earlier than the last move. Enter a later date.');
  if (move.to === 'ready' || move.to === 'handed_over' || move.to === 'sold') {
    // A safety item that failed or was never recorded on one of its jobs holds the vehicle back
    // until it is put right or the owner signs it off (issue 10).
    const blockers = await vehicleHandOverBlockers(manager, shopId, vehicleId);
    if (blockers.length > 0) {
      const first = blockers.slice(0, 3).map((b) => `${b.label} (job ${b.jobNumber}, ${b.reason === 'failed' ? 'failed' : 'not recorded'})`);
      throw new HttpError(
        409,
        'conflict',
        `This vehicle cannot be “${vehicleStatusLabels[move.to]}” yet: ${first.join('; ')}${blockers.length > 3 ? ` and ${blockers.length - 3} more` : ''}. Put the work right on the job, or have the owner sign it off there.`,
        { reason: 'safety_blockers', blockers },
      );
    }
  }
  await shopScoped(manager, VehicleStatusChangeEntity, shopId).insert({ id: randomUUID(), vehicleId, fromStatus: before.status, toStatus: move.to, changedAt: at, recordedAt: now, byUserId: actor.userId, note: move.note });
  await shopScoped(manager, VehicleEntity, shopId).update({ id: vehicleId }, { status: move.to, statusSince: at, updatedAt: now });
  await recordAudit(manager, {
    shopId,
    actor,
    action: 'vehicle.status_changed',
    entity: 'vehicle',
    entityId: vehicleId,
    changes: { status: { before: before.status, after: move.to }, statusSince: { before: iso(before.statusSince), after: iso(at) }, ...(move.note ? { note: { before: null, after: move.note } } : {}) },
    at: now,
  });
}

/**
 * Vehicles: records, identification checks, status moves, odometer readings, numbers-matching
 * checks, photos and documents, a timeline, and the parts that fit. Every write goes through the
 * write lock with its audit event; every id is looked up within the shop.
 */
export function createVehiclesService(deps: { db: Database; clock: Clock; files: FileStore; freeStock?: FreeStockLookup }) {
  const { db, clock, files } = deps;
  const freeStock = deps.freeStock ?? ledgerFreeStock(db);

  async function vehicleRow(manager: EntityManager, shopId: string, vehicleId: string): Promise<VehicleRow> {
    const row = await shopScoped(manager, VehicleEntity, shopId).findOne({ id: vehicleId });
    if (!row) throw noSuchVehicle();
    return row;
  }

  async function currencyOf(shopId: string): Promise<string> {
    const settings = await db.reader.findOne(ShopSettingsEntity, { where: { shopId } });
    return settings?.currency ?? defaultShopSettings.currency;
  }

  async function people(ids: Array<string | null>): Promise<Map<string, { id: string; name: string }>> {
    const wanted = [...new Set(ids.filter((x): x is string => x !== null))];
    if (wanted.length === 0) return new Map();
    const rows = await db.reader.find(UserEntity, { where: { id: In(wanted) }, select: { id: true, name: true } });
    return new Map(rows.map((u) => [u.id, { id: u.id, name: u.name }]));
  }

  const toReading = (r: OdometerReadingRow, who: Map<string, { id: string; name: string }>): OdometerReading => ({
    id: r.id,
    value: r.value,
    unit: r.unit,
    readOn: r.readOn,
    note: r.note,
    recordedBy: r.byUserId ? (who.get(r.byUserId) ?? null) : null,
    createdAt: iso(r.createdAt),
  });

  const toFile = (f: VehicleFileRow, who: Map<string, { id: string; name: string }>): VehicleFile => ({
    id: f.id,
    kind: f.kind,
    originalName: f.originalName,
    mediaType: f.mediaType,
    byteSize: f.byteSize,
    width: f.width,
    height: f.height,
    caption: f.caption,
    hasThumbnail: f.thumbnailKey !== null,
    uploadedBy: f.byUserId ? (who.get(f.byUserId) ?? null) : null,
    createdAt: iso(f.createdAt),
  });

  /** List views of some vehicles of one shop, with their customer, latest reading and photos. */
  async function views(shopId: string, rows: VehicleRow[]): Promise<Vehicle[]> {
    if (rows.length === 0) return [];
    const ids = rows.map((r) => r.id);
    const customerIds = [...new Set(rows.map((r) => r.customerId).filter((x): x is string => x !== null))];
    const customers = customerIds.length ? await db.reader.find(CustomerEntity, { where: { shopId, id: In(customerIds) }, select: { id: true, name: true } }) : [];
    const customerById = new Map(customers.map((c) => [c.id, { id: c.id, name: c.name }]));
    const readings = await db.reader.find(OdometerReadingEntity, { where: { shopId, vehicleId: In(ids) }, order: { readOn: 'DESC', createdAt: 'DESC' } });
    const latest = new Map<string, OdometerReadingRow>();
    for (const r of readings) if (!latest.has(r.vehicleId)) latest.set(r.vehicleId, r);
    const photos = await db.reader.find(VehicleFileEntity, { where: { shopId, vehicleId: In(ids), kind: 'photo' }, order: { createdAt: 'ASC' }, select: { id: true, vehicleId: true } });
    const photoIds = new Map<string, string[]>();
    for (const p of photos) photoIds.set(p.vehicleId, [...(photoIds.get(p.vehicleId) ?? []), p.id]);
    const who = await people([...rows.map((r) => r.numbersCheckedByUserId), ...[...latest.values()].map((r) => r.byUserId)]);
    const currency = await currencyOf(shopId);
    return rows.map((row) => {
      const reading = latest.get(row.id);
      const ownPhotos = photoIds.get(row.id) ?? [];
      return {
        id: row.id,
        kind: row.kind,
        marque: row.marque,
        model: row.model,
        year: row.year,
        colour: row.colour,
        frameNumber: row.frameNumber,
        engineNumber: row.engineNumber,
        vin: row.vin,
        vinCheck: row.vin === null || row.vin.length !== 17 ? 'not_checked' : row.vinCheckAcknowledgedAt ? 'acknowledged_failure' : 'passed',
        condition: row.condition,
        notes: row.notes,
        customer: row.customerId ? (customerById.get(row.customerId) ?? null) : null,
        acquisitionCostMinor: row.acquisitionCostMinor,
        askingPriceMinor: row.askingPriceMinor,
        currency,
        status: row.status,
        statusSince: iso(row.statusSince),
        numbersMatching: row.numbersMatching === null ? null : Boolean(row.numbersMatching),
        numbersCheckedBy: row.numbersCheckedByUserId ? (who.get(row.numbersCheckedByUserId) ?? null) : null,
        numbersCheckedAt: row.numbersCheckedAt ? iso(row.numbersCheckedAt) : null,
        numbersNote: row.numbersNote,
        latestOdometer: reading ? toReading(reading, who) : null,
        photoCount: ownPhotos.length,
        coverPhotoId: ownPhotos[0] ?? null,
        createdAt: iso(row.createdAt),
        updatedAt: iso(row.updatedAt),
      };
    });
  }

  async function detail(shopId: string, vehicleId: string): Promise<VehicleDetail> {
    const row = await vehicleRow(db.reader, shopId, vehicleId);
    const [view] = await views(shopId, [row]);
    if (!view) throw noSuchVehicle();
    const readings = await db.reader.find(OdometerReadingEntity, { where: { shopId, vehicleId }, order: { readOn: 'DESC', createdAt: 'DESC' } });
    const fileRows = await db.reader.find(VehicleFileEntity, { where: { shopId, vehicleId }, order: { createdAt: 'DESC', id: 'ASC' } });
    const changes = await db.reader.find(VehicleStatusChangeEntity, { where: { shopId, vehicleId }, order: { changedAt: 'ASC', recordedAt: 'ASC' } });
    const who = await people([...readings.map((r) => r.byUserId), ...fileRows.map((f) => f.byUserId), ...changes.map((c) => c.byUserId)]);
    return {
      ...view,
      odometerReadings: readings.map((r) => toReading(r, who)),
      files: fileRows.map((f) => toFile(f, who)),
      statusHistory: changes.map((c) => toStatusChange(c, who)),
      nextStatuses: vehicleStatusMoves[row.status].filter((to) => canMoveVehicle(row.kind, row.status, to)),
    };
  }

  const toStatusChange = (c: VehicleStatusChangeRow, who: Map<string, { id: string; name: string }>): StatusChange => ({
    id: c.id,
    from: c.fromStatus,
    to: c.toStatus,
    at: iso(c.changedAt),
    note: c.note,
    by: c.byUserId ? (who.get(c.byUserId) ?? null) : null,
  });

  function notInFuture(at: Date, what: string): void {
    if (at.getTime() > clock.now().getTime() + clockSkewMs) throw badRequest(`${what} cannot be in the future.`);
  }

  /** A calendar day is "today" somewhere on Earth until UTC+14 has moved on; later days are refused. */
  function dayNotInFuture(day: string, what: string): void {
    const latest = new Date(clock.now().getTime() + 14 * 3_600_000).toISOString().slice(0, 10);
    if (day > latest) throw badRequest(`${what} cannot be in the future.`);
  }

  /** The instant a vehicle arrived on `day`: noon that day, but never later than now. */
  function arrivalInstant(day: string): Date {
    const noon = dateAt(day);
    const now = clock.now();
    return noon.getTime() > now.getTime() ? now : noon;
  }

  return {
    detail,

    /** The vehicle's total cost (acquisition + all its jobs) against its asking price (issue 10). */
    async costs(shopId: string, vehicleId: string) {
      return vehicleCosts(db.reader, shopId, await vehicleRow(db.reader, shopId, vehicleId));
    },

    /** A page of the shop's vehicles, filtered by kind, status, marque, a customer or a search word. */
    async list(shopId: string, query: VehicleListQuery): Promise<VehicleListResponse> {
      const qb = db.reader.createQueryBuilder(VehicleEntity, 'v').where('v.shopId = :shopId', { shopId });
      if (query.kind) qb.andWhere('v.kind = :kind', { kind: query.kind });
      if (query.status) qb.andWhere('v.status = :status', { status: query.status });
      if (query.marque) qb.andWhere('lower(v.marque) = lower(:marque)', { marque: query.marque });
      if (query.customerId) qb.andWhere('v.customerId = :customerId', { customerId: query.customerId });
      if (query.q) {
        const like = `%${query.q.toLowerCase().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
        qb.andWhere(
          `(lower(v.marque) LIKE :like ESCAPE '\\' OR lower(v.model) LIKE :like ESCAPE '\\' OR lower(coalesce(v.frameNumber, '')) LIKE :like ESCAPE '\\' OR lower(coalesce(v.engineNumber, '')) LIKE :like ESCAPE '\\' OR lower(coalesce(v.vin, '')) LIKE :like ESCAPE '\\')`,
          { like },
        );
      }
      const [rows, total] = await qb
        .orderBy('v.statusSince', 'DESC')
        .addOrderBy('v.id', 'ASC')
        .skip((query.page - 1) * query.pageSize)
        .take(query.pageSize)
        .getManyAndCount();
      const marques = await db.reader.query<Array<{ marque: string }>>(`SELECT marque FROM vehicles WHERE shop_id = ? GROUP BY marque ORDER BY lower(marque)`, [shopId]);
      return { items: await views(shopId, rows), total, page: query.page, pageSize: query.pageSize, marques: marques.map((m) => m.marque) };
    },

    /** Records a vehicle arriving: status `arrived`, its first status change and, if given, its first odometer reading. */
    async create(shopId: string, input: VehicleCreate, actor: AuditActor, mayChange: FieldPermission): Promise<VehicleDetail> {
      if (input.acquisitionCostMinor !== null && !mayChange('acquisitionCostMinor')) throw forbidden('Your role may not set the acquisition cost.');
      if (input.askingPriceMinor !== null && !mayChange('askingPriceMinor')) throw forbidden('Your role may not set the asking price.');
      const vin = decideVin(input.vin, input.acknowledgeCheckDigit);
      const now = clock.now();
      if (input.arrivedOn) dayNotInFuture(input.arrivedOn, 'The arrival date');
      if (input.odometer) dayNotInFuture(input.odometer.readOn, 'The reading date');
      const arrivedAt = input.arrivedOn ? arrivalInstant(input.arrivedOn) : now;
      const { acknowledgeCheckDigit: _ack, odometer, arrivedOn: _arrived, ...fields } = input;
      const row: VehicleRow = {
        id: randomUUID(),
        shopId,
        ...fields,
        vinCheckAcknowledgedByUserId: vin.acknowledged ? actor.userId : null,
        vinCheckAcknowledgedAt: vin.acknowledged ? now : null,
        status: 'arrived',
        statusSince: arrivedAt,
        numbersMatching: null,
        numbersCheckedByUserId: null,
        numbersCheckedAt: null,
        numbersNote: null,
        createdAt: now,
        updatedAt: now,
      };
      checkMoneyForKind(row);
      await db.write(async (manager) => {
        if (row.customerId) await customerInShop(manager, shopId, row.customerId);
        // The plan's vehicle limit counts vehicles still in the shop (not handed over or sold).
        await assertVehicleRoom(manager, shopId);
        await shopScoped(manager, VehicleEntity, shopId).insert(row);
        await shopScoped(manager, VehicleStatusChangeEntity, shopId).insert({ id: randomUUID(), vehicleId: row.id, fromStatus: null, toStatus: 'arrived', changedAt: arrivedAt, recordedAt: now, byUserId: actor.userId, note: null });
        const changes: AuditChanges = Object.fromEntries(Object.entries(fields).flatMap(([k, v]) => (v == null ? [] : [[k, { before: null, after: v as unknown }]])));
        if (vin.acknowledged) changes['vinCheckAcknowledged'] = { before: null, after: true };
        await recordAudit(manager, { shopId, actor, action: 'vehicle.created', entity: 'vehicle', entityId: row.id, changes, at: now });
        if (odometer) {
          const reading = { id: randomUUID(), vehicleId: row.id, ...odometer, byUserId: actor.userId, createdAt: now };
          await shopScoped(manager, OdometerReadingEntity, shopId).insert(reading);
          await recordAudit(manager, { shopId, actor, action: 'vehicle.odometer_recorded', entity: 'vehicle', entityId: row.id, changes: { odometer: { before: null, after: `${odometer.value} ${odometer.unit} on ${odometer.readOn}` } }, at: now });
        }
      });
      return detail(shopId, row.id);
    },

    /**
     * Changes a vehicle's record. Money fields the caller may not change are refused (403) before
     * anything is written; a new VIN is checked again.
     */
    async update(shopId: string, vehicleId: string, patch: VehiclePatch, actor: AuditActor, mayChange: FieldPermission): Promise<VehicleDetail> {
      await db.write(async (manager) => {
        const before = await vehicleRow(manager, shopId, vehicleId);
        const { acknowledgeCheckDigit, ...fields } = patch;
        const changes = diffChanges(before, fields);
        for (const field of ['acquisitionCostMinor', 'askingPriceMinor'] as const) {
          if (field in changes && !mayChange(field)) throw forbidden(`Your role may not change the ${field === 'acquisitionCostMinor' ? 'acquisition cost' : 'asking price'}.`);
        }
        const after: VehicleRow = { ...before, ...fields } as VehicleRow;
        checkMoneyForKind(after);
        const now = clock.now();
        const extra: Partial<VehicleRow> = {};
        if ('vin' in changes || acknowledgeCheckDigit) {
          const vin = decideVin(after.vin, acknowledgeCheckDigit ?? false);
          extra.vinCheckAcknowledgedByUserId = vin.acknowledged ? actor.userId : null;
          extra.vinCheckAcknowledgedAt = vin.acknowledged ? now : null;
          if (vin.acknowledged !== (before.vinCheckAcknowledgedAt !== null)) changes['vinCheckAcknowledged'] = { before: before.vinCheckAcknowledgedAt !== null, after: vin.acknowledged };
        }
        if ('customerId' in changes && after.customerId) await customerInShop(manager, shopId, after.customerId);
        if (Object.keys(changes).length === 0) return;
        await shopScoped(manager, VehicleEntity, shopId).update({ id: vehicleId }, { ...fields, ...extra, updatedAt: now });
        await recordAudit(manager, { shopId, actor, action: 'vehicle.updated', entity: 'vehicle', entityId: vehicleId, changes, at: now });
      });
      return detail(shopId, vehicleId);
    },

    /** Moves a vehicle to its next status, dated (now by default), with a status-change row and an audit event. */
    async moveStatus(shopId: string, vehicleId: string, move: StatusMove, actor: AuditActor): Promise<VehicleDetail> {
      const now = clock.now();
      const at = move.at ? new Date(move.at) : now;
      notInFuture(at, 'The date of the move');
      await db.write((manager) => moveVehicleStatus(manager, shopId, vehicleId, { to: move.to, at, note: move.note }, actor, now));
      return detail(shopId, vehicleId);
    },

    async addOdometerReading(shopId: string, vehicleId: string, input: OdometerCreate, actor: AuditActor): Promise<OdometerReading> {
      dayNotInFuture(input.readOn, 'The reading date');
      const now = clock.now();
      const row: Omit<OdometerReadingRow, 'shopId'> = { id: randomUUID(), vehicleId, ...input, byUserId: actor.userId, createdAt: now };
      await db.write(async (manager) => {
        await vehicleRow(manager, shopId, vehicleId);
        await shopScoped(manager, OdometerReadingEntity, shopId).insert(row);
        await recordAudit(manager, { shopId, actor, action: 'vehicle.odometer_recorded', entity: 'vehicle', entityId: vehicleId, changes: { odometer: { before: null, after: `${input.value} ${input.unit} on ${input.readOn}` } }, at: now });
      });
      return toReading({ ...row, shopId }, await people([actor.userId]));
    },

    /** Records whether the frame and engine numbers agree with the documents, with who checked and when. */
    async recordNumbersCheck(shopId: string, vehicleId: string, input: NumbersCheck, actor: AuditActor): Promise<VehicleDetail> {
      await db.write(async (manager) => {
        const before = await vehicleRow(manager, shopId, vehicleId);
        const now = clock.now();
        const patch = { numbersMatching: input.matching, numbersCheckedByUserId: actor.userId, numbersCheckedAt: now, numbersNote: input.note, updatedAt: now };
        await shopScoped(manager, VehicleEntity, shopId).update({ id: vehicleId }, patch);
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'vehicle.numbers_checked',
          entity: 'vehicle',
          entityId: vehicleId,
          changes: { numbersMatching: { before: before.numbersMatching === null ? null : Boolean(before.numbersMatching), after: input.matching }, ...(input.note ? { numbersNote: { before: before.numbersNote, after: input.note } } : {}) },
          at: now,
        });
      });
      return detail(shopId, vehicleId);
    },

    /** Everything that happened to a vehicle, newest first. Jobs join this list when they exist. */
    async timeline(shopId: string, vehicleId: string): Promise<{ entries: TimelineEntry[] }> {
      const row = await vehicleRow(db.reader, shopId, vehicleId);
      const full = await detail(shopId, vehicleId);
      const entries: TimelineEntry[] = [];
      for (const c of full.statusHistory) {
        entries.push({ kind: 'status', at: c.at, title: c.from === null ? `Arrived` : `${vehicleStatusLabels[c.from]} → ${vehicleStatusLabels[c.to]}`, detail: c.note, by: c.by, refId: c.id });
      }
      for (const r of full.odometerReadings) {
        // A reading dated today sits at the time it was recorded, not at noon ahead of later events.
        const readAt = Math.min(dateAt(r.readOn).getTime(), new Date(r.createdAt).getTime());
        entries.push({ kind: 'odometer', at: new Date(readAt).toISOString(), title: `Odometer ${r.value.toLocaleString('en-GB')} ${r.unit}`, detail: r.note, by: r.recordedBy, refId: r.id });
      }
      for (const f of full.files) {
        entries.push({ kind: f.kind, at: f.createdAt, title: f.kind === 'photo' ? `Photo added: ${f.originalName}` : `Document added: ${f.originalName}`, detail: f.caption, by: f.uploadedBy, refId: f.id });
      }
      if (row.numbersCheckedAt) {
        entries.push({ kind: 'numbers_check', at: iso(row.numbersCheckedAt), title: row.numbersMatching ? 'Numbers checked: matching the documents' : 'Numbers checked: not matching the documents', detail: row.numbersNote, by: full.numbersCheckedBy, refId: null });
      }
      entries.push({ kind: 'created', at: iso(row.createdAt), title: 'Record created', detail: null, by: null, refId: null });
      entries.push(...(await jobTimelineEntries(db.reader, shopId, vehicleId)));
      entries.sort((a, b) => b.at.localeCompare(a.at));
      return { entries };
    },

    /**
     * Parts whose catalogue fitment covers this vehicle: same marque and model (ignoring case),
     * its year inside the year range, and its frame number not outside the frame range. A range
     * that cannot be compared (different series, no frame number) is kept and marked 'unknown':
     * a person decides, the code does not guess.
     */
    async fitment(shopId: string, vehicleId: string): Promise<VehicleFitmentResponse> {
      const v = await vehicleRow(db.reader, shopId, vehicleId);
      const qb = db.reader
        .createQueryBuilder(FitmentEntity, 'f')
        .where('f.shopId = :shopId', { shopId })
        .andWhere('lower(f.marque) = lower(:marque) AND lower(f.model) = lower(:model)', { marque: v.marque, model: v.model });
      if (v.year !== null) {
        qb.andWhere('(f.yearFrom IS NULL OR f.yearFrom <= :year) AND (f.yearTo IS NULL OR f.yearTo >= :year)', { year: v.year });
      }
      const fitments = await qb.getMany();
      const matches = new Map<string, { fitment: (typeof fitments)[number]; frameMatch: 'yes' | 'unknown' }>();
      for (const f of fitments) {
        const hasRange = Boolean(f.frameFrom?.trim() || f.frameTo?.trim());
        const verdict = !hasRange ? 'yes' : v.frameNumber ? frameInRange(v.frameNumber, f.frameFrom, f.frameTo) : 'unknown';
        if (verdict === 'no') continue;
        const seen = matches.get(f.partId);
        // One row per part: a definite fit wins over an unknown one.
        if (!seen || (seen.frameMatch === 'unknown' && verdict === 'yes')) matches.set(f.partId, { fitment: f, frameMatch: verdict });
      }
      const partIds = [...matches.keys()];
      const parts = partIds.length ? await db.reader.find(PartEntity, { where: { shopId, id: In(partIds) } }) : [];
      const stock = partIds.length ? await freeStock(shopId, partIds) : new Map<string, { free: number; bins: string[] }>();
      const result: FitmentMatch[] = parts
        .flatMap((p): FitmentMatch[] => {
          const m = matches.get(p.id);
          if (!m) return [];
          return [{
            partId: p.id,
            number: p.number,
            description: p.description,
            origin: p.origin,
            status: p.status,
            fitment: { yearFrom: m.fitment.yearFrom, yearTo: m.fitment.yearTo, frameFrom: m.fitment.frameFrom, frameTo: m.fitment.frameTo },
            frameMatch: m.frameMatch,
            freeStock: stock.get(p.id)?.free ?? 0,
            bins: stock.get(p.id)?.bins ?? [],
          }];
        })
        .sort((a, b) => a.number.localeCompare(b.number));
      return { parts: result, stockKnown: true };
    },

    /** Fails with 404 unless the vehicle is in the shop (checked before an upload is read). */
    async assertVehicle(shopId: string, vehicleId: string): Promise<void> {
      await vehicleRow(db.reader, shopId, vehicleId);
    },

    /**
     * Stores checked uploads and their rows. Bytes are written first (under server-made names),
     * then the rows in one transaction; if that fails, the bytes are removed again, so a failed
     * upload leaves neither a file nor a row behind.
     */
    async addFiles(shopId: string, vehicleId: string, uploads: PreparedUpload[], caption: string | null, actor: AuditActor): Promise<VehicleFile[]> {
      await vehicleRow(db.reader, shopId, vehicleId);
      const now = clock.now();
      const rows: VehicleFileRow[] = uploads.map((u) => {
        const id = randomUUID();
        const base = `${shopId}/vehicles/${vehicleId}/${id}`;
        return {
          id,
          shopId,
          vehicleId,
          kind: u.kind,
          originalName: u.originalName,
          mediaType: u.mediaType,
          byteSize: u.data.length,
          storageKey: `${base}.${u.extension}`,
          thumbnailKey: u.thumbnail ? `${base}.thumb.jpg` : null,
          width: u.width,
          height: u.height,
          caption,
          byUserId: actor.userId,
          createdAt: now,
        };
      });
      const written: string[] = [];
      try {
        for (const [i, u] of uploads.entries()) {
          const row = rows[i];
          if (!row) continue;
          await files.put(row.storageKey, u.data);
          written.push(row.storageKey);
          if (row.thumbnailKey && u.thumbnail) {
            await files.put(row.thumbnailKey, u.thumbnail);
            written.push(row.thumbnailKey);
          }
        }
        await db.write(async (manager) => {
          await vehicleRow(manager, shopId, vehicleId);
          await manager.insert(VehicleFileEntity, rows);
          for (const row of rows) {
            await recordAudit(manager, {
              shopId,
              actor,
              action: 'vehicle.file_added',
              entity: 'vehicle',
              entityId: vehicleId,
              changes: { file: { before: null, after: { id: row.id, kind: row.kind, name: row.originalName, mediaType: row.mediaType, bytes: row.byteSize } } },
              at: now,
            });
          }
        });
      } catch (err) {
        await Promise.all(written.map((key) => files.remove(key).catch(() => undefined)));
        throw err;
      }
      const who = await people([actor.userId]);
      return rows.map((r) => toFile(r, who));
    },

    /** The bytes of a file (or its thumbnail) of a vehicle of this shop; anything else is 404. */
    async readFile(shopId: string, vehicleId: string, fileId: string, variant: 'original' | 'thumbnail'): Promise<{ row: VehicleFileRow; data: Buffer }> {
      const row = await shopScoped(db.reader, VehicleFileEntity, shopId).findOne({ id: fileId, vehicleId });
      if (!row) throw noSuchFile();
      const key = variant === 'thumbnail' ? row.thumbnailKey : row.storageKey;
      if (!key) throw notFound('This file has no thumbnail.');
      try {
        return { row, data: await files.read(key) };
      } catch {
        throw notFound('The stored file is missing. Upload it again.');
      }
    },

    /** Removes a file: the row and audit event first, then the bytes once that has committed. */
    async removeFile(shopId: string, vehicleId: string, fileId: string, actor: AuditActor): Promise<void> {
      const row = await db.write(async (manager) => {
        const found = await shopScoped(manager, VehicleFileEntity, shopId).findOne({ id: fileId, vehicleId });
        if (!found) throw noSuchFile();
        await manager.delete(VehicleFileEntity, { shopId, id: fileId });
        await recordAudit(manager, { shopId, actor, action: 'vehicle.file_removed', entity: 'vehicle', entityId: vehicleId, changes: { file: { before: { id: found.id, kind: found.kind, name: found.originalName }, after: null } }, at: clock.now() });
        return found;
      });
      await files.remove(row.storageKey);
      if (row.thumbnailKey) await files.remove(row.thumbnailKey);
    },
  };
}

export type VehiclesService = ReturnType<typeof createVehiclesService>;
