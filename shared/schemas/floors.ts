import { z } from "zod";

import { isUsableScale } from "../calc/hand-rub-spacing";
import { constructionClasses, fixtureKinds, zoneTypes } from "../zones";
import { numberInput, requiredText, text, uuidSchema, responseText } from "./common";

const coordinate = numberInput()
  .min(-1_000_000, { message: "Out of range." })
  .max(1_000_000, { message: "Out of range." });
export const planPointSchema = z.strictObject({ x: coordinate, y: coordinate });

const positive = (max: number) =>
  numberInput()
    .positive({ message: "Must be more than zero." })
    .max(max, { message: `At most ${max}.` });

export const imageSchema = z.object({ id: uuidSchema, width: z.number(), height: z.number() });
export type ImageInfo = z.infer<typeof imageSchema>;

export const floorSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  building: responseText(),
  level: z.number().int(),
  name: responseText(),
  /** The plan image; `width`/`height` of the floor's coordinate space stay fixed across replacements. */
  plan: z.object({ imageId: uuidSchema, width: z.number(), height: z.number() }).nullable(),
  metresPerUnit: z.number().nullable(),
  scaleReference: z
    .object({ a: planPointSchema, b: planPointSchema, distanceMetres: z.number() })
    .nullable(),
});
export type Floor = z.infer<typeof floorSchema>;

export const floorBodySchema = z.strictObject({
  building: requiredText(80),
  level: numberInput()
    .int({ message: "A whole number." })
    .min(-20, { message: "At least -20." })
    .max(200, { message: "At most 200." }),
  name: requiredText(80),
});
export const updateFloorBodySchema = floorBodySchema
  .partial()
  .refine((body) => Object.keys(body).length > 0, {
    message: "Change at least one field.",
  });
export const floorParamsSchema = z.strictObject({ floorId: uuidSchema });
export const siteFloorsParamsSchema = z.strictObject({ siteId: uuidSchema });

export const scaleBodySchema = z
  .strictObject({ a: planPointSchema, b: planPointSchema, distanceMetres: positive(10_000) })
  .refine((body) => body.a.x !== body.b.x || body.a.y !== body.b.y, {
    message: "Choose two different points.",
    path: ["b"],
  })
  .refine(
    // Points a hair apart or a vanishing distance would store a scale of zero or infinity.
    (body) => {
      const units = Math.hypot(body.b.x - body.a.x, body.b.y - body.a.y);
      return units === 0 || isUsableScale(body.distanceMetres / units);
    },
    {
      message: "This distance and these points give no usable scale; pick points further apart.",
      path: ["distanceMetres"],
    },
  );
export type ScaleBody = z.infer<typeof scaleBodySchema>;

const polygonSchema = z
  .array(
    z.tuple([coordinate, coordinate], {
      message: "Each corner is one position across the plan and one down it.",
    }),
    {
      message: "Draw the outline again: each corner needs a position across and down the plan.",
    },
  )
  .min(3, { message: "At least three corners." })
  .max(200, { message: "At most 200 corners." });

export const spaceSchema = z.object({
  id: uuidSchema,
  floorId: uuidSchema,
  zoneType: z.enum(zoneTypes),
  name: responseText(),
  number: responseText().nullable(),
  polygon: z.array(z.tuple([z.number(), z.number()])),
  suiteId: uuidSchema.nullable(),
  constructionClass: z.enum(constructionClasses).nullable(),
  volumeM3: z.number().nullable(),
  floorAreaM2: z.number().nullable(),
  ceilingHeightM: z.number().nullable(),
});
export type Space = z.infer<typeof spaceSchema>;

export const spaceBodySchema = z.strictObject({
  zoneType: z.enum(zoneTypes, { message: "Choose a zone type." }),
  name: requiredText(80),
  number: text().trim().max(20, { message: "At most 20 characters." }).nullable().optional(),
  polygon: polygonSchema,
  suiteId: uuidSchema.nullable().optional(),
  constructionClass: z
    .enum(constructionClasses, { message: "Choose a construction class." })
    .nullable()
    .optional(),
  volumeM3: positive(100_000).nullable().optional(),
  floorAreaM2: positive(100_000).nullable().optional(),
  ceilingHeightM: positive(100).nullable().optional(),
});
export type SpaceBody = z.infer<typeof spaceBodySchema>;
export const updateSpaceBodySchema = spaceBodySchema
  .partial()
  .refine((body) => Object.keys(body).length > 0, {
    message: "Change at least one field.",
  });
export const spaceParamsSchema = z.strictObject({ spaceId: uuidSchema });

export const suiteSchema = z.object({ id: uuidSchema, floorId: uuidSchema, name: responseText() });
export type Suite = z.infer<typeof suiteSchema>;
export const suiteBodySchema = z.strictObject({ name: requiredText(80) });

export const fixtureSchema = z.object({
  id: uuidSchema,
  spaceId: uuidSchema,
  kind: z.enum(fixtureKinds),
  x: z.number(),
  y: z.number(),
  label: responseText().nullable(),
});
export type Fixture = z.infer<typeof fixtureSchema>;

export const fixtureBodySchema = z.strictObject({
  kind: z.enum(fixtureKinds, { message: "Choose a fixture type." }),
  x: coordinate,
  y: coordinate,
  label: text().trim().max(80, { message: "At most 80 characters." }).nullable().optional(),
});
export type FixtureBody = z.infer<typeof fixtureBodySchema>;
export const updateFixtureBodySchema = fixtureBodySchema
  .omit({ kind: true })
  .partial()
  .refine((body) => Object.keys(body).length > 0, { message: "Change at least one field." });
export const fixtureParamsSchema = z.strictObject({ fixtureId: uuidSchema });

export const floorDetailResponseSchema = z.object({
  floor: floorSchema,
  suites: z.array(suiteSchema),
  spaces: z.array(spaceSchema),
  fixtures: z.array(fixtureSchema),
});
export type FloorDetail = z.infer<typeof floorDetailResponseSchema>;

export const floorsResponseSchema = z.object({ floors: z.array(floorSchema) });

export const imageParamsSchema = z.strictObject({ imageId: uuidSchema });
export const imageQuerySchema = z.strictObject({
  variant: z.enum(["display", "thumb"]).default("display"),
});

export const uploadedImageSchema = z.object({
  id: uuidSchema,
  width: z.number(),
  height: z.number(),
  bytes: z.number(),
  sha256: responseText(),
  /** true when the same picture was already stored for this site: nothing new was stored. */
  duplicate: z.boolean(),
});
export type UploadedImage = z.infer<typeof uploadedImageSchema>;

/** Accepted upload formats, decided from the file's content. */
export const acceptedImageTypes = ["image/jpeg", "image/png", "image/webp"] as const;
export const maxUploadBytes = 15 * 1024 * 1024;
