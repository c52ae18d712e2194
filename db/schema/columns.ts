import { customType } from "drizzle-orm/pg-core";

/** Binary data (previews, thumbnails, export files) as Node buffers. */
export const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });
