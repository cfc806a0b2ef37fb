import { z } from "zod";

import {
  numberInput,
  requiredText,
  text,
  timeZoneSchema,
  uuidSchema,
  responseText,
} from "./common";

export const siteSchema = z.object({
  id: uuidSchema,
  name: responseText(),
  address: responseText(),
  timeZone: responseText(),
  latitude: z.number(),
  longitude: z.number(),
});
export type Site = z.infer<typeof siteSchema>;

export const siteListResponseSchema = z.object({ sites: z.array(siteSchema) });
export type SiteListResponse = z.infer<typeof siteListResponseSchema>;

export const siteResponseSchema = z.object({ site: siteSchema });
export type SiteResponse = z.infer<typeof siteResponseSchema>;

export const siteParamsSchema = z.strictObject({ siteId: uuidSchema });

const latitude = numberInput()
  .min(-90, { message: "Between -90 and 90." })
  .max(90, { message: "Between -90 and 90." });
const longitude = numberInput()
  .min(-180, { message: "Between -180 and 180." })
  .max(180, { message: "Between -180 and 180." });

export const createSiteBodySchema = z.strictObject({
  name: requiredText(120),
  address: requiredText(300),
  timeZone: timeZoneSchema,
  latitude,
  longitude,
});
export type CreateSiteBody = z.infer<typeof createSiteBodySchema>;

export const updateSiteBodySchema = createSiteBodySchema
  .partial()
  .extend({ reason: text().trim().max(500, { message: "At most 500 characters." }).optional() })
  .refine((body) => Object.keys(body).some((key) => key !== "reason"), {
    message: "Change at least one field.",
  });
export type UpdateSiteBody = z.infer<typeof updateSiteBodySchema>;
