// The sales models, exported together so models/index.ts needs one line for them.
export { SaleLine } from './saleLine';
export { SaleImport } from './saleImport';
export { SalesMapping } from './salesMapping';
