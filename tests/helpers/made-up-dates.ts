import { randomInt } from "node:crypto";

/**
 * Made-up dates for the api tests' room-pressure readings, in ranges that never meet. The api
 * test files share one database and run side by side, and the readings' monthly partitions belong
 * to the database, not to a test's network: a test that makes or drops the partition of a month
 * must be the only one using that month.
 */

/** 1981–1998, for the partition job's test: its round drops every month before this year's March. */
export const partitionJobYear = () => 1981 + randomInt(0, 18);

/** The 15th of a month in 2001–2020, for a reading whose month is given a partition of its own. */
export const storageMonth = () => new Date(Date.UTC(2001, randomInt(0, 240), 15));

/** Midnight of a day in 2040–2049, for the ingest's readings, which stay in the DEFAULT partition. */
export const ingestDay = () => Date.UTC(2040, 0, 1) + randomInt(0, 3650) * 86_400_000;
