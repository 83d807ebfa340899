// PostgreSQL twins of ../*.ts, in the same order (a test checks the timestamps match one for one).
import { InitialSchema1764633600000Pg } from './1764633600000-initial-schema';
import { Catalogue1764720000000Pg } from './1764720000000-catalogue';
import { ShopAdministration1764806400000Pg } from './1764806400000-shop-administration';
import { PartSearch1764900000000Pg } from './1764900000000-part-search';
import { Stock1765000000000Pg } from './1765000000000-stock';
import { Vehicles1765100000000Pg } from './1765100000000-vehicles';
import { Billing1765200000000Pg } from './1765200000000-billing';
import { Purchasing1765400000000Pg } from './1765400000000-purchasing';
import { Jobs1765500000000Pg } from './1765500000000-jobs';
import { StockCounts1765600000000Pg } from './1765600000000-stock-counts';
import { Sales1765700000000Pg } from './1765700000000-sales';
import { EstimatesAndConsignment1765800000000Pg } from './1765800000000-estimates-and-consignment';
import { PurchaseSpecialOrders1766000000000Pg } from './1766000000000-purchase-special-orders';
import { SharedState1766100000000Pg } from './1766100000000-shared-state';
import { StockMovementsByKind1766200000000Pg } from './1766200000000-stock-movements-by-kind';

/** Committed PostgreSQL migrations, in order. */
export const postgresMigrations = [InitialSchema1764633600000Pg, Catalogue1764720000000Pg, ShopAdministration1764806400000Pg, PartSearch1764900000000Pg, Stock1765000000000Pg, Vehicles1765100000000Pg, Billing1765200000000Pg, Purchasing1765400000000Pg, Jobs1765500000000Pg, StockCounts1765600000000Pg, Sales1765700000000Pg, EstimatesAndConsignment1765800000000Pg, PurchaseSpecialOrders1766000000000Pg, SharedState1766100000000Pg, StockMovementsByKind1766200000000Pg];
