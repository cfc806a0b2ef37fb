import { z } from "zod";

import { zoneTypes } from "../zones";
import { responseText, text, uuidSchema } from "./common";

/** Retiring or restoring a site, floor or space; the reason goes into the change log. */
export const retirementBodySchema = z.strictObject({
  reason: text().trim().max(500, { message: "At most 500 characters." }).optional(),
});
export type RetirementBody = z.infer<typeof retirementBodySchema>;

export const retiredKinds = ["site", "floor", "space"] as const;

/** What one retirement or restore did. */
export const retirementResultSchema = z.object({
  retirement: z.object({
    kind: z.enum(retiredKinds),
    id: uuidSchema,
    name: responseText(),
    /** When it was retired; null after a restore. */
    retiredAt: responseText().nullable(),
    /** Floors and spaces retired or restored by this one step, the item itself included. */
    floors: z.number().int(),
    spaces: z.number().int(),
    /** Unfinished corrective actions made done (retire) or put back (restore). */
    actions: z.number().int(),
  }),
});
export type RetirementResult = z.infer<typeof retirementResultSchema>["retirement"];

const retiredBase = {
  id: uuidSchema,
  name: responseText(),
  retiredAt: responseText(),
  retiredByName: responseText().nullable(),
};

export const retiredFloorSchema = z.object({
  ...retiredBase,
  building: responseText(),
  level: z.number().int(),
});
export type RetiredFloor = z.infer<typeof retiredFloorSchema>;

export const retiredSpaceSchema = z.object({
  ...retiredBase,
  zoneType: z.enum(zoneTypes),
  floorId: uuidSchema,
  floorName: responseText(),
  /** Retired with its floor: it comes back when the floor is restored. */
  floorRetired: z.boolean(),
});
export type RetiredSpace = z.infer<typeof retiredSpaceSchema>;

export const retiredPlacesResponseSchema = z.object({
  floors: z.array(retiredFloorSchema),
  spaces: z.array(retiredSpaceSchema),
});
export type RetiredPlaces = z.infer<typeof retiredPlacesResponseSchema>;

export const retiredSiteSchema = z.object(retiredBase);
export type RetiredSite = z.infer<typeof retiredSiteSchema>;
export const retiredSitesResponseSchema = z.object({ sites: z.array(retiredSiteSchema) });
