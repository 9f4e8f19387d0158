// The whole Drizzle schema (mysql-core). drizzle-kit reads this file; each area keeps its
// tables in ./schema/<area>.ts and adds one export line here.
// Id scheme: varchar(26) random base32 from newId() in ./ids.ts; every table after shops has shopId.
export * from './schema/auth';
export * from './schema/harness';
export * from './schema/orders';
export * from './schema/readings';
export * from './schema/bus';
