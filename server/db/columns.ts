import { customType, datetime, varchar } from 'drizzle-orm/mysql-core';

/** The column shapes every schema file uses. Ids: see server/db/ids.ts (varchar(26)). */
export const id = (name = 'id') => varchar(name, { length: 26 });
/** Millisecond timestamps. */
export const at = (name: string) => datetime(name, { mode: 'date', fsp: 3 });
export const now = () => new Date();

/**
 * JSON kept as text (MariaDB's JSON is LONGTEXT with a validity check, and the driver hands it
 * back as a string): written with JSON.stringify, read with JSON.parse, so key order and every
 * number survive exactly.
 */
export const jsonText = <T>(name: string) =>
  customType<{ data: T; driverData: string }>({
    dataType: () => 'longtext',
    toDriver: (value) => JSON.stringify(value),
    fromDriver: (value) => (typeof value === 'string' ? (JSON.parse(value) as T) : (value as T)),
  })(name);
