import { type SpaceBody, spaceBodySchema } from "@shared/schemas/floors";
import { z } from "zod";

import { optionalNumberText } from "@/lib/form-values";

/** The suite select's value for "make a new suite with the name typed below". */
export const newSuiteValue = "new";

const shape = spaceBodySchema.shape;

export const spaceFormSchema = z
  .object({
    zoneType: z.string(),
    name: shape.name,
    number: z
      .string()
      .trim()
      .max(20, { message: "At most 20 characters." })
      .transform((value) => (value === "" ? null : value)),
    suite: z.string(),
    suiteName: z.string().trim().max(80, { message: "At most 80 characters." }),
    constructionClass: z.string(),
    volumeM3: optionalNumberText(shape.volumeM3),
    floorAreaM2: optionalNumberText(shape.floorAreaM2),
    ceilingHeightM: optionalNumberText(shape.ceilingHeightM),
  })
  .superRefine((values, context) => {
    if (!shape.zoneType.safeParse(values.zoneType).success) {
      context.addIssue({ code: "custom", path: ["zoneType"], message: "Choose a zone type." });
    }
    if (values.zoneType === "isolation_room" && values.constructionClass === "") {
      context.addIssue({
        code: "custom",
        path: ["constructionClass"],
        message: "Choose a construction class: it decides the air-change minimum.",
      });
    }
    if (values.suite === newSuiteValue && values.suiteName === "") {
      context.addIssue({
        code: "custom",
        path: ["suiteName"],
        message: "Give the new suite a name.",
      });
    }
  });

export type SpaceFormValues = z.input<typeof spaceFormSchema>;
export type SpaceFormOutput = z.output<typeof spaceFormSchema>;

export const emptySpaceForm: SpaceFormValues = {
  zoneType: "",
  name: "",
  number: "",
  suite: "",
  suiteName: "",
  constructionClass: "",
  volumeM3: "",
  floorAreaM2: "",
  ceilingHeightM: "",
};

export type SuiteChoice =
  { kind: "none" } | { kind: "existing"; id: string } | { kind: "new"; name: string };

export function suiteChoiceOf(values: SpaceFormOutput): SuiteChoice {
  if (values.suite === newSuiteValue) return { kind: "new", name: values.suiteName };
  if (values.suite === "") return { kind: "none" };
  return { kind: "existing", id: values.suite };
}

/** The request body for a drawn outline; construction class only counts for isolation rooms. */
export function spaceBodyFrom(
  values: SpaceFormOutput,
  polygon: [number, number][],
  suiteId: string | null,
): SpaceBody {
  const zoneType = shape.zoneType.parse(values.zoneType);
  const constructionClass =
    zoneType === "isolation_room" && values.constructionClass !== ""
      ? shape.constructionClass.parse(values.constructionClass)
      : null;
  return {
    zoneType,
    name: values.name,
    number: values.number,
    polygon,
    suiteId,
    constructionClass,
    volumeM3: values.volumeM3,
    floorAreaM2: values.floorAreaM2,
    ceilingHeightM: values.ceilingHeightM,
  };
}

/** Every body field the server may name, as the form's own field names. */
export const spaceFieldNames = [
  "zoneType",
  "name",
  "number",
  "constructionClass",
  "volumeM3",
  "floorAreaM2",
  "ceilingHeightM",
] as const;
