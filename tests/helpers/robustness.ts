import { randomUUID } from "node:crypto";

import { sql } from "drizzle-orm";
import type { z } from "zod";

import type { Database } from "../../server/db/client";

/**
 * Malformed requests generated from a valid one. A variant is either `refused` — it must get a
 * 4xx (naming `field` when one is at fault) and write nothing — or `tolerated`, which may be valid
 * (emoji, right-to-left text, a missing optional field) and must only never get a 5xx.
 */
export interface Variant {
  label: string;
  expect: "refused" | "tolerated";
  /** The field a refusal must name (`error.fields` has it, or a field inside it). */
  field?: string;
  /** The field was left out: naming its parent (or the body) names the fault too. */
  missing?: boolean;
  params?: Record<string, string>;
  /** JSON text sent as is, with its content type (default application/json). */
  raw?: string;
  contentType?: string;
  /** No body at all. */
  noBody?: boolean;
  upload?: {
    field: string;
    file: Buffer;
    name: string;
    fields?: Record<string, string>;
  } | null;
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type Path = (string | number)[];

const uuidPattern = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const oneMegabyte = 1024 * 1024;

/** Characters a text field must refuse, each with a name for the report. */
export const refusedCharacters: Record<string, string> = {
  NUL: "\u0000",
  "U+0008": "\u0008",
  ESC: "\u001b",
  DEL: "\u007f",
  "U+009B": "\u009b",
  "lone surrogate": "\ud800",
  "U+FFFF": "\uffff",
};
/** Text that may well be valid: it must never break the server. */
export const tolerableTexts: Record<string, string> = {
  emoji: " 😷🧤",
  "right-to-left": " חדר בידוד غرفة",
  "combining marks": " é̃̈",
};
export const prototypeKeys = ["__proto__", "constructor", "toString"];

const clone = <T>(value: T): T => structuredClone(value);
const dotted = (path: Path) => path.join(".");

function setAt(root: Json, path: Path, value: Json | undefined): Json {
  const copy = clone(root);
  if (path.length === 0) return value as Json;
  let node = copy as Record<string | number, Json>;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string | number, Json>;
  const last = path[path.length - 1]!;
  if (value === undefined) {
    if (Array.isArray(node)) node.splice(Number(last), 1);
    else delete node[last];
  } else node[last] = value;
  return copy;
}

/** Every path inside the value (not the root), parents before children. */
function pathsOf(value: Json, path: Path = []): { path: Path; value: Json }[] {
  const found: { path: Path; value: Json }[] = [];
  if (value && typeof value === "object") {
    const entries = Array.isArray(value)
      ? value.map((child, index) => [index, child] as const)
      : Object.entries(value);
    for (const [key, child] of entries) {
      found.push({ path: [...path, key], value: child });
      found.push(...pathsOf(child, [...path, key]));
    }
  }
  return found;
}

function wrongTypes(value: Json): Json[] {
  if (typeof value === "string") return [12345, true, { text: value }, [value]];
  if (typeof value === "number") return [String(value), true, [value]];
  if (typeof value === "boolean") return [String(value), 1];
  if (value === null) return [12345, "text", true];
  if (Array.isArray(value)) return [{ ...value }, "text", 7];
  return [[value], "text", 7];
}

/** The longest value the schema accepts in this place, grown from the valid one; null if unbounded. */
function longestAccepted(schema: z.ZodType, body: Json, path: Path, value: string): number | null {
  const accepts = (length: number) =>
    schema.safeParse(setAt(body, path, value.padEnd(length, "a"))).success;
  if (accepts(oneMegabyte)) return null;
  let low = value.length;
  let high = oneMegabyte;
  while (high - low > 1) {
    const middle = Math.floor((low + high) / 2);
    if (accepts(middle)) low = middle;
    else high = middle;
  }
  return low;
}

/** JSON text of `body` with `key` added inside the object at `path` (kept as a key, not a prototype). */
function withKey(body: Json, path: Path, key: string, value: Json): string {
  const marker = `__robustness_marker_${randomUUID()}__`;
  return JSON.stringify(setAt(body, [...path, marker], value)).replace(
    JSON.stringify(marker),
    JSON.stringify(key),
  );
}

/**
 * The JSON-body battery for one route: every place in the valid body gets wrong types, removal,
 * refused characters, a megabyte, one character past its limit, tolerable text, unknown and
 * malformed ids; every object gets extra and prototype keys; the whole body comes as the wrong
 * shape and the wrong content type. `schema` only sorts variants whose fate it decides (a missing
 * optional field, a null where null is allowed) into tolerated; what must be refused is refused
 * whatever the schema says.
 */
export function bodyVariants(
  schema: z.ZodType,
  body: Json,
  options: { newIds: string[] },
): Variant[] {
  const variants: Variant[] = [];
  const json = (label: string, value: Json | undefined, field: string, must = false): Variant => {
    const text = JSON.stringify(value);
    const refused = must || !schema.safeParse(value).success;
    return {
      label,
      expect: refused ? "refused" : "tolerated",
      field: refused ? field : undefined,
      raw: text,
    };
  };

  for (const { path, value } of pathsOf(body)) {
    const field = dotted(path);
    for (const wrong of wrongTypes(value))
      variants.push(json(`${field} as ${JSON.stringify(wrong)}`, setAt(body, path, wrong), field));
    variants.push({
      ...json(`${field} missing`, setAt(body, path, undefined), field),
      missing: true,
    });
    if (typeof value === "string") {
      for (const [name, character] of Object.entries(refusedCharacters))
        variants.push(
          json(`${field} with ${name}`, setAt(body, path, `${value}${character}`), field, true),
        );
      variants.push({
        label: `${field} of 1 MB`,
        expect: "refused",
        raw: JSON.stringify(setAt(body, path, "a".repeat(oneMegabyte))),
      });
      const longest = longestAccepted(schema, body, path, value);
      if (longest !== null)
        variants.push(
          json(
            `${field} of ${longest + 1} characters`,
            setAt(body, path, value.padEnd(longest + 1, "a")),
            field,
            true,
          ),
        );
      for (const [name, extra] of Object.entries(tolerableTexts))
        variants.push(json(`${field} with ${name}`, setAt(body, path, `${value}${extra}`), field));
      if (uuidPattern.test(value)) {
        variants.push(json(`${field} not an id`, setAt(body, path, "not-an-id"), field, true));
        if (!options.newIds.includes(`body.${field}`))
          variants.push({
            label: `${field} unknown id`,
            expect: "refused",
            raw: JSON.stringify(setAt(body, path, randomUUID())),
          });
      }
    }
  }

  const objects = [
    { path: [] as Path, value: body },
    ...pathsOf(body).filter(
      ({ value }) => value && typeof value === "object" && !Array.isArray(value),
    ),
  ];
  for (const { path } of objects) {
    const prefix = path.length ? `${dotted(path)}.` : "";
    variants.push({
      label: `${prefix}unexpectedField added`,
      expect: "refused",
      field: `${prefix}unexpectedField`,
      raw: withKey(body, path, "unexpectedField", "surprise"),
    });
    for (const key of prototypeKeys)
      variants.push({
        label: `${prefix}${key} added`,
        expect: "refused",
        field: `${prefix}${key}`,
        raw: withKey(body, path, key, { polluted: true }),
      });
  }

  variants.push(json("body as an array", [body], "body", true));
  variants.push({ label: "body as a string", expect: "refused", field: "body", raw: '"text"' });
  variants.push({ label: "body as null", expect: "refused", field: "body", raw: "null" });
  variants.push({ label: "body not JSON", expect: "refused", field: "body", raw: "{not json" });
  const emptyAccepted = schema.safeParse(undefined).success;
  const noBody = emptyAccepted ? "tolerated" : "refused";
  const bodyField = emptyAccepted ? undefined : "body";
  variants.push({
    label: "JSON as text/plain",
    expect: noBody,
    field: bodyField,
    raw: JSON.stringify(body),
    contentType: "text/plain",
  });
  variants.push({
    label: "form-encoded",
    expect: noBody,
    field: bodyField,
    raw: "name=Ward+4&level=2",
    contentType: "application/x-www-form-urlencoded",
  });
  variants.push({ label: "no body", expect: noBody, field: bodyField, noBody: true });
  return variants;
}

/** Params that are not ids, ids of nothing, and refused characters, one param at a time. */
export function paramVariants(
  params: Record<string, string>,
  options: { newIds: string[] },
): Variant[] {
  const variants: Variant[] = [];
  for (const [name, value] of Object.entries(params)) {
    const at = (label: string, replaced: string, field?: string): Variant => ({
      label: `params.${name} ${label}`,
      expect: "refused",
      field,
      params: { ...params, [name]: replaced },
    });
    if (uuidPattern.test(value)) {
      variants.push(at("not an id", "not-an-id", name));
      variants.push(at("an id with NUL", `${value}\u0000`, name));
      if (!options.newIds.includes(`params.${name}`)) variants.push(at("unknown id", randomUUID()));
    } else {
      variants.push(at("with NUL", `${value}\u0000`, name));
      // A key the caller names (a new sequence's) is made by the request, like a device id.
      if (!options.newIds.includes(`params.${name}`))
        variants.push(at("unknown", "nothing-like-this"));
    }
    variants.push(at("of 4000 characters", value.padEnd(4000, "a")));
    variants.push(at("as dot segments", "..%2F..%2Fetc"));
  }
  return variants;
}

/** A multipart route's battery: no file, a text file called .jpg, the wrong field, JSON instead. */
export function uploadVariants(
  upload: NonNullable<Variant["upload"]>,
  fieldsSchema?: z.ZodType,
): Variant[] {
  const variants: Variant[] = [
    {
      label: "no file",
      expect: "refused",
      field: upload.field,
      upload: { ...upload, file: Buffer.alloc(0), name: "" },
    },
    {
      label: "a text file named .jpg",
      expect: "refused",
      field: upload.field,
      upload: { ...upload, file: Buffer.from("this is not a picture\n"), name: "photo.jpg" },
    },
    {
      label: "the file in another field",
      expect: "refused",
      field: "picture",
      upload: { ...upload, field: "picture" },
    },
    {
      label: "JSON instead of a file",
      expect: "refused",
      field: upload.field,
      raw: JSON.stringify({ [upload.field]: "photo.jpg" }),
    },
  ];
  const fields = upload.fields ?? {};
  for (const [name, value] of Object.entries(fields)) {
    const { [name]: _removed, ...rest } = fields;
    const withField = (label: string, changed: Record<string, string>, field: string) => {
      const refused = !fieldsSchema?.safeParse(changed).success;
      variants.push({
        label: `fields.${name} ${label}`,
        expect: refused ? "refused" : "tolerated",
        field: refused ? field : undefined,
        upload: { ...upload, fields: changed },
      });
    };
    withField("missing", rest, name);
    withField("with NUL", { ...fields, [name]: `${value}\u0000` }, name);
    withField("not an id", { ...fields, [name]: "not-an-id" }, name);
  }
  if (upload.fields) {
    for (const key of ["unexpectedField", ...prototypeKeys])
      variants.push({
        label: `fields.${key} added`,
        expect: "refused",
        field: key,
        upload: { ...upload, fields: { ...fields, [key]: "x" } },
      });
  }
  return variants;
}

/**
 * Tables the fingerprint leaves out, and why. Everything else is compared row for row (count and
 * an md5 of the rows in order) before and after the refused requests.
 */
export const unfingerprintedTables: Record<string, string> = {
  __drizzle_migrations: "migrations, written only at start-up",
};

/** Row count and md5 of each table's rows, ordered; cheap on the small database the walk uses. */
export async function fingerprint(db: Database): Promise<Record<string, string>> {
  const { rows } = await db.execute<{ table_name: string }>(
    sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' order by table_name`,
  );
  const tables = rows
    .map((row) => row.table_name)
    .filter((name) => !(name in unfingerprintedTables));
  const union = tables
    .map(
      (name) =>
        `select '${name}' as name, count(*)::text || ':' || coalesce(md5(string_agg(t::text, '|' order by t::text)), '') as print from "${name}" t`,
    )
    .join(" union all ");
  const result = await db.execute<{ name: string; print: string }>(sql.raw(union));
  return Object.fromEntries(result.rows.map((row) => [row.name, row.print]));
}

export function changedTables(before: Record<string, string>, after: Record<string, string>) {
  return Object.keys({ ...before, ...after }).filter((name) => before[name] !== after[name]);
}
