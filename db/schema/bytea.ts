import { customType } from 'drizzle-orm/pg-core';

/** PostgreSQL bytea as a Node Buffer (uploaded files are kept byte for byte). */
export const bytea = customType<{ data: Buffer; driverData: Buffer }>({
  dataType: () => 'bytea',
});
