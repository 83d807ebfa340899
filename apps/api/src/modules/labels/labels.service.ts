import { In } from 'typeorm';
import {
  defaultShopSettings,
  labelSheetLayouts,
  labelsPerPage,
  maxDistinctLabelsPerRequest,
  maxLabelBinsPerRequest,
  maxLabelsPerRequest,
  type BinLabelsRequestParsed,
  type CountLabelsRequestParsed,
  type ReceiptLabelsRequestParsed,
  type LabelFormat,
  type LabelOptions,
  type PartLabelsRequestParsed,
} from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import { badRequest, notFound } from '../../lib/http-error';
import { PartEntity } from '../catalogue/catalogue.entity';
import { ShopSettingsEntity } from '../settings/settings.entity';
import { BinEntity, StockLineEntity } from '../stock/stock.entity';
import { PurchaseReceiptEntity } from '../purchasing/purchasing.entity';
import { renderLabelPdf, type LabelItem } from './label-pdf';

/** Where a shop keeps its parts: bin codes per part id, most stock first. */
export type BinCodesOf = (shopId: string, partIds: string[]) => Promise<Map<string, string[]>>;

/** Bin codes from the stock lines (a line stays after its stock is gone: the part's place). */
function stockBinCodes(db: Database): BinCodesOf {
  return async (shopId, partIds) => {
    const lines = await shopScoped(db.reader, StockLineEntity, shopId).find({ partId: In(partIds) });
    const bins = lines.length ? await shopScoped(db.reader, BinEntity, shopId).find({ id: In([...new Set(lines.map((l) => l.binId))]) }) : [];
    const codeOf = new Map(bins.map((b) => [b.id, b.code]));
    const onHand = new Map<string, Map<string, number>>();
    for (const line of lines) {
      const code = codeOf.get(line.binId);
      if (!code) continue;
      const perPart = onHand.get(line.partId) ?? new Map<string, number>();
      perPart.set(code, (perPart.get(code) ?? 0) + line.onHand);
      onHand.set(line.partId, perPart);
    }
    return new Map(
      [...onHand].map(([partId, perBin]) => [
        partId,
        [...perBin].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).map(([code]) => code),
      ]),
    );
  };
}

/** A rendered label file. */
export interface LabelPdf {
  bytes: Uint8Array;
  format: LabelFormat;
  labels: number;
  pages: number;
}

/** The subtitle of a part label: its bin(s), or nothing when it has none. */
export function binLine(bins: string[] | undefined): string {
  if (!bins || bins.length === 0) return '';
  return `${bins.length === 1 ? 'Bin' : 'Bins'} ${bins.join(', ')}`;
}

/** The bins of a stock count (counts.service `binIdsOf`: a foreign or unknown count is a 404). */
export interface CountBins {
  binIdsOf(shopId: string, countId: string): Promise<string[]>;
}

/** Label sheets for a shop's parts, bins, purchase receipts and stock counts. Reads only. */
export function createLabelsService(deps: { db: Database; binCodesOf?: BinCodesOf; counts?: CountBins }) {
  const { db } = deps;
  const binCodesOf = deps.binCodesOf ?? stockBinCodes(db);

  /** The shop's chosen format (the owner sets it in settings; defaults until then). */
  async function defaultFormat(shopId: string): Promise<LabelFormat> {
    const row = await db.reader.findOne(ShopSettingsEntity, { where: { shopId } });
    return (row?.labelSheetFormat as LabelFormat | undefined) ?? defaultShopSettings.labelSheetFormat;
  }

  async function render(shopId: string, items: LabelItem[], request: { format?: LabelFormat; skip: number }, title: string): Promise<LabelPdf> {
    const format = request.format ?? (await defaultFormat(shopId));
    const perPage = labelsPerPage(format);
    const skip = perPage === 1 ? 0 : Math.min(request.skip, perPage - 1);
    return { bytes: await renderLabelPdf(items, format, { skip, title }), format, labels: items.length, pages: Math.ceil((items.length + skip) / perPage) };
  }

  return {
    defaultFormat,

    /** The shop default and every format with its size, for the print dialog. */
    async options(shopId: string): Promise<LabelOptions> {
      return {
        defaultFormat: await defaultFormat(shopId),
        formats: Object.values(labelSheetLayouts).map((l) => ({ id: l.id, name: l.name, labelsPerPage: labelsPerPage(l.id), labelWidthMm: l.labelWidthMm, labelHeightMm: l.labelHeightMm })),
      };
    },

    /**
     * Labels for chosen parts, in the order given, each `copies` times. Every id is looked up in
     * the shop: one unknown (or another shop's) id is a 404 and nothing is rendered.
     */
    async partLabels(shopId: string, request: PartLabelsRequestParsed): Promise<LabelPdf> {
      const parts = await shopScoped(db.reader, PartEntity, shopId).find({ id: In(request.partIds) });
      const byId = new Map(parts.map((p) => [p.id, p]));
      const missing = request.partIds.filter((id) => !byId.has(id));
      if (missing.length > 0) throw notFound(missing.length === 1 ? 'One of the chosen parts is not in this shop.' : `${missing.length} of the chosen parts are not in this shop.`);
      const bins = await binCodesOf(shopId, request.partIds);
      const items: LabelItem[] = [];
      for (const id of request.partIds) {
        const part = byId.get(id);
        if (!part) continue;
        for (let c = 0; c < request.copies; c += 1) items.push({ code: part.number, title: part.description, subtitle: binLine(bins.get(id)) });
      }
      return render(shopId, items, request, items.length === 1 ? `Label ${items[0]?.code ?? ''}` : `${items.length} part labels`);
    },

    /**
     * A label per bin (code, description, how many parts it holds) and, with `contents`, after
     * each bin a label for every part with stock in it. Unknown or foreign bins are a 404.
     */
    binLabels,

    /** Labels for the bins of a stock count (and with `contents`, the parts in each). */
    async countLabels(shopId: string, countId: string, request: CountLabelsRequestParsed): Promise<LabelPdf> {
      if (!deps.counts) throw new Error('createLabelsService needs `counts` for count labels.');
      const binIds = await deps.counts.binIdsOf(shopId, countId);
      if (binIds.length === 0) throw badRequest('This count covers no bins: there is nothing to label.');
      return binLabels(shopId, { ...request, binIds: binIds.slice(0, maxLabelBinsPerRequest) });
    },

    /**
     * Labels for what arrived: one per unit received (or one per receipt), with the part's number,
     * description and the bin it went into. Unknown or foreign receipts are a 404.
     */
    async receiptLabels(shopId: string, request: ReceiptLabelsRequestParsed): Promise<LabelPdf> {
      const receipts = await shopScoped(db.reader, PurchaseReceiptEntity, shopId).find({ id: In(request.receiptIds) });
      const byId = new Map(receipts.map((r) => [r.id, r]));
      if (request.receiptIds.some((id) => !byId.has(id))) throw notFound('One of the chosen receipts is not in this shop.');
      const lines = await db.reader.query<Array<{ id: string; partId: string }>>(
        `SELECT id, part_id AS partId FROM purchase_order_lines WHERE shop_id = ? AND id IN (${receipts.map(() => '?').join(', ')})`,
        [shopId, ...receipts.map((r) => r.lineId)],
      );
      const partOfLine = new Map(lines.map((l) => [l.id, l.partId]));
      const partIds = [...new Set(receipts.map((r) => partOfLine.get(r.lineId)).filter((id): id is string => id !== undefined))];
      const parts = partIds.length ? await shopScoped(db.reader, PartEntity, shopId).find({ id: In(partIds) }) : [];
      const partById = new Map(parts.map((p) => [p.id, p]));
      const bins = await shopScoped(db.reader, BinEntity, shopId).find({ id: In([...new Set(receipts.map((r) => r.binId))]) });
      const binCode = new Map(bins.map((b) => [b.id, b.code]));
      const items: LabelItem[] = [];
      for (const id of request.receiptIds) {
        const receipt = byId.get(id)!;
        const part = partById.get(partOfLine.get(receipt.lineId) ?? '');
        if (!part) continue;
        const copies = request.perUnit ? receipt.quantity : 1;
        for (let c = 0; c < copies; c += 1) items.push({ code: part.number, title: part.description, subtitle: binLine(binCode.has(receipt.binId) ? [binCode.get(receipt.binId)!] : []) });
      }
      if (items.length === 0) throw badRequest('Nothing to label on those receipts.');
      if (items.length > maxLabelsPerRequest) throw badRequest(`That is ${items.length} labels; print at most ${maxLabelsPerRequest} at a time (one per receipt, or fewer receipts).`);
      return render(shopId, items, request, items.length === 1 ? `Label ${items[0]?.code ?? ''}` : `${items.length} labels for goods received`);
    },
  };

  /**
   * A label per bin (code, description, how many parts it holds) and, with `contents`, after
   * each bin a label for every part with stock in it. Unknown or foreign bins are a 404.
   */
  async function binLabels(shopId: string, request: BinLabelsRequestParsed): Promise<LabelPdf> {
      const bins = await shopScoped(db.reader, BinEntity, shopId).find({ id: In(request.binIds) });
      const byId = new Map(bins.map((b) => [b.id, b]));
      if (request.binIds.some((id) => !byId.has(id))) throw notFound('One of the chosen bins is not in this shop.');
      const lines = (await shopScoped(db.reader, StockLineEntity, shopId).find({ binId: In(request.binIds) })).filter((l) => l.onHand > 0);
      const parts = lines.length ? await shopScoped(db.reader, PartEntity, shopId).find({ id: In([...new Set(lines.map((l) => l.partId))]) }) : [];
      const partById = new Map(parts.map((p) => [p.id, p]));
      const items: LabelItem[] = [];
      for (const id of request.binIds) {
        const bin = byId.get(id);
        if (!bin) continue;
        const inBin = [...new Set(lines.filter((l) => l.binId === id).map((l) => l.partId))]
          .map((partId) => partById.get(partId))
          .filter((p) => p !== undefined)
          .sort((a, b) => a.key.localeCompare(b.key));
        items.push({ code: bin.code, title: bin.description ?? '', subtitle: inBin.length === 1 ? '1 part' : `${inBin.length} parts` });
        if (request.contents) for (const part of inBin) items.push({ code: part.number, title: part.description, subtitle: `Bin ${bin.code}` });
      }
      const distinct = new Set(items.map((i) => i.code)).size;
      if (items.length > maxLabelsPerRequest || distinct > maxDistinctLabelsPerRequest) {
        throw badRequest(`These bins need ${items.length} labels; print at most ${Math.min(maxLabelsPerRequest, maxDistinctLabelsPerRequest)} different labels at a time (choose fewer bins).`);
      }
      return render(shopId, items, request, items.length === 1 ? `Bin ${items[0]?.code ?? ''}` : `${items.length} bin labels`);
  }
}

export type LabelsService = ReturnType<typeof createLabelsService>;
