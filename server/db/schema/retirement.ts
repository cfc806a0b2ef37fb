import { timestamp, uuid } from "drizzle-orm/pg-core";

import { users } from "./users";

/**
 * What a site, floor or space keeps when it is retired instead of deleted. `retirement_id` names
 * the one retirement that hid it: retiring a floor gives the floor and the spaces it hides the same
 * id, so restoring the floor brings back exactly those spaces and not one retired before.
 */
export const retirementColumns = () => ({
  retiredAt: timestamp("retired_at", { withTimezone: true }),
  retiredBy: uuid("retired_by").references(() => users.id, { onDelete: "set null" }),
  retirementId: uuid("retirement_id"),
});
