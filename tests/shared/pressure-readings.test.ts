import { describe, expect, it } from "vitest";

import {
  futureReadingProblem,
  monitorIdFromTopic,
  parsePressureMessage,
  pressureInPascals,
  pressureReadingBatchSchema,
  pressureTopic,
  pressureTopicFilter,
} from "@shared/schemas/pressure-readings";
import { parsePressureCsv } from "@shared/schemas/pressure-readings-csv";

const topic = "lintel/pressure/AIIR-204";
const message = (body: Record<string, unknown>) => JSON.stringify(body);
const good = { measuredAt: "2026-12-03T10:14:05Z", pressure: -3.1, unit: "Pa" };

/** The field → message pairs of a refused JSON batch, as the server's 400 names them. */
function batchFields(body: unknown): Record<string, string> {
  const result = pressureReadingBatchSchema.safeParse(body);
  expect(result.success).toBe(false);
  const fields: Record<string, string> = {};
  for (const issue of result.error!.issues) {
    const path =
      issue.code === "unrecognized_keys"
        ? [...issue.path, ...issue.keys].join(".")
        : issue.path.join(".");
    fields[path] ??= issue.message;
  }
  return fields;
}

describe("topics", () => {
  it("when a monitor's topic is built and read back, then it is lintel/pressure/<monitor id>", () => {
    expect(pressureTopic("AIIR-204")).toBe(topic);
    expect(monitorIdFromTopic(topic)).toBe("AIIR-204");
    expect(pressureTopicFilter()).toBe("lintel/pressure/+");
    expect(pressureTopic("rm.3:east", "site/wexley")).toBe("site/wexley/rm.3:east");
    expect(monitorIdFromTopic("site/wexley/rm.3:east", "site/wexley")).toBe("rm.3:east");
  });

  it("when a topic is not one monitor's, then it names no monitor", () => {
    expect(monitorIdFromTopic("lintel/pressure/AIIR-204/extra")).toBeNull();
    expect(monitorIdFromTopic("lintel/pressure/")).toBeNull();
    expect(monitorIdFromTopic("lintel/doors/AIIR-204")).toBeNull();
    expect(monitorIdFromTopic("lintel/pressureX/AIIR-204")).toBeNull();
  });

  it("when an id cannot be one topic level or a prefix has a wildcard, then it is refused", () => {
    expect(() => pressureTopic("a/b")).toThrow(/Monitor id/);
    expect(() => pressureTopic("#")).toThrow(/Monitor id/);
    expect(() => pressureTopic(" A1")).toThrow(/Monitor id/);
    expect(() => pressureTopicFilter("lintel/+")).toThrow(/wildcards/);
  });
});

describe("one MQTT message", () => {
  it("when a reading comes on a monitor's topic, then the monitor is the topic's and the door is null when not sent", () => {
    const parsed = parsePressureMessage(topic, Buffer.from(message({ ...good, rssi: -61 })));
    expect(parsed).toEqual({
      ok: true,
      reading: {
        monitorId: "AIIR-204",
        measuredAt: new Date("2026-12-03T10:14:05Z"),
        pressure: -3.1,
        unit: "Pa",
        door: null,
      },
    });
  });

  it("when the unit is spelt as buildings spell it and the time has an offset, then it is read", () => {
    const parsed = parsePressureMessage(
      topic,
      message({
        measuredAt: "2026-12-03T11:14:05+01:00",
        pressure: -0.012,
        unit: "in. w.c.",
        door: "Open",
      }),
    );
    expect(parsed.ok && parsed.reading).toMatchObject({
      measuredAt: new Date("2026-12-03T10:14:05Z"),
      unit: "inH2O",
      door: "open",
    });
  });

  it("when the payload names another monitor than its topic, then it is refused naming monitorId", () => {
    expect(parsePressureMessage(topic, message({ ...good, monitorId: "AIIR-205" }))).toEqual({
      ok: false,
      problems: [{ field: "monitorId", message: expect.stringMatching(/AIIR-205.*AIIR-204/) }],
    });
    expect(parsePressureMessage(topic, message({ ...good, monitorId: "AIIR-204" })).ok).toBe(true);
  });

  it("when the message is not a reading, then the problem names the topic, the payload or the field", () => {
    const fieldsOf = (t: string, payload: string | Uint8Array) => {
      const parsed = parsePressureMessage(t, payload);
      return parsed.ok ? null : parsed.problems.map((problem) => problem.field);
    };
    expect(fieldsOf("lintel/other/AIIR-204", message(good))).toEqual(["topic"]);
    expect(fieldsOf(topic, "{not json")).toEqual(["payload"]);
    expect(fieldsOf(topic, "[1, 2]")).toEqual(["payload"]);
    expect(fieldsOf(topic, new Uint8Array([0x7b, 0xff, 0x7d]))).toEqual(["payload"]); // not UTF-8
    expect(fieldsOf(topic, message({ ...good, pad: "x".repeat(5000) }))).toEqual(["payload"]);
    expect(fieldsOf(topic, message({ ...good, pressure: "-3.1" }))).toEqual(["pressure"]);
    expect(fieldsOf(topic, message({ ...good, measuredAt: "2026-12-03 10:14:05" }))).toEqual([
      "measuredAt",
    ]);
    expect(fieldsOf(topic, message({ ...good, unit: "kPa" }))).toEqual(["unit"]);
    expect(fieldsOf(topic, message({ ...good, door: "ajar" }))).toEqual(["door"]);
    expect(fieldsOf(topic, message({ measuredAt: good.measuredAt }))).toEqual(["pressure", "unit"]);
  });

  it("when a reading is implausible or the monitor's clock was never set, then it is refused with the audits' plausible range", () => {
    const problems = (body: Record<string, unknown>) => {
      const parsed = parsePressureMessage(topic, message(body));
      return parsed.ok ? [] : parsed.problems;
    };
    // ±100 Pa is the audits' plausible range (answer-rules.ts); 0.5 in. w.c. = 124.5 Pa.
    expect(problems({ ...good, pressure: 0.5, unit: "inH2O" })).toEqual([
      { field: "pressure", message: expect.stringMatching(/100 Pa/) },
    ]);
    expect(problems({ ...good, pressure: -100 })).toEqual([]);
    expect(problems({ ...good, measuredAt: "1970-01-01T00:00:00Z" })).toEqual([
      { field: "measuredAt", message: expect.stringMatching(/clock looks unset/) },
    ]);
  });

  it("when a reading is in Pa or in. w.c., then its Pa value uses 1 in. w.c. = 249.08891 Pa", () => {
    // NIST SP 811 conventional inch of water (references §2, from memory; = 0.0254 × 9.80665 × 1000).
    expect(pressureInPascals({ pressure: -0.01, unit: "inH2O" })).toBeCloseTo(-2.4908891, 7);
    expect(pressureInPascals({ pressure: -3.1, unit: "Pa" })).toBe(-3.1);
  });

  it("when a reading is dated ahead of the clock, then up to one minute is allowed and more is refused", () => {
    const now = new Date("2026-12-03T10:00:00Z");
    expect(futureReadingProblem(new Date("2026-12-03T10:01:00Z"), now)).toBeNull();
    expect(futureReadingProblem(new Date("2026-12-03T10:01:00.001Z"), now)).toMatchObject({
      field: "measuredAt",
    });
  });
});

describe("a JSON batch", () => {
  it("when every reading is good, then all are read", () => {
    const parsed = pressureReadingBatchSchema.parse({
      readings: [
        { monitorId: "AIIR-204", ...good, door: "closed" },
        { monitorId: "AIIR-205", ...good, door: null },
      ],
    });
    expect(parsed.readings.map((r) => [r.monitorId, r.door])).toEqual([
      ["AIIR-204", "closed"],
      ["AIIR-205", null],
    ]);
  });

  it("when readings are bad, then each field is named by its place in the batch", () => {
    expect(
      batchFields({
        readings: [
          { monitorId: "AIIR-204", ...good },
          { monitorId: "a/b", ...good, pressure: 250 },
          { ...good, extra: 1 },
        ],
      }),
    ).toEqual({
      "readings.1.monitorId": expect.stringMatching(/letters, digits/),
      "readings.1.pressure": expect.stringMatching(/100 Pa/),
      "readings.2.monitorId": "Required.",
      "readings.2.extra": expect.any(String),
    });
    expect(batchFields({ readings: [] })).toEqual({ readings: "Send at least one reading." });
    expect(batchFields({})).toEqual({ readings: "Send a list of readings." });
  });

  it("when a batch has more than 10,000 readings, then it is refused as a whole", () => {
    const readings = Array.from({ length: 10_001 }, () => ({ monitorId: "AIIR-204", ...good }));
    expect(batchFields({ readings })).toEqual({
      readings: "At most 10,000 readings in one upload.",
    });
  });
});

describe("a CSV batch", () => {
  it("when the file is good, then every row is read, whatever the header's spelling and column order", () => {
    const csv =
      "\uFEFFMonitor ID,pressure,Measured_At,unit,door\r\n" +
      "AIIR-204,-3.1,2026-12-03T10:14:05Z,Pa,closed\r\n" +
      "AIIR-204,-0.012,2026-12-03T10:14:10Z,inH2O,\r\n";
    const { readings, problems } = parsePressureCsv(csv);
    expect(problems).toEqual([]);
    expect(readings).toEqual([
      {
        monitorId: "AIIR-204",
        measuredAt: new Date("2026-12-03T10:14:05Z"),
        pressure: -3.1,
        unit: "Pa",
        door: "closed",
      },
      {
        monitorId: "AIIR-204",
        measuredAt: new Date("2026-12-03T10:14:10Z"),
        pressure: -0.012,
        unit: "inH2O",
        door: null,
      },
    ]);
  });

  it("when rows are bad, then each is reported by its line in the file and its column, and the good rows are kept", () => {
    // Line 1 header; 2 good; 3 blank; 4–5 one quoted cell over two lines (bad id); 6 decimal
    // comma, unknown unit and door, time without offset; 7 a cell short; 8 unset clock and
    // implausible value; 9 good, the door in capitals.
    const csv = [
      "monitor_id,measured_at,pressure,unit,door",
      "AIIR-204,2026-12-03T10:00:00Z,-3.1,Pa,closed",
      "",
      '"AIIR',
      '204",2026-12-03T10:00:05Z,-3.1,Pa,',
      'AIIR-204,2026-12-03 10:00,"-3,1",kPa,ajar',
      "AIIR-204,2026-12-03T10:00:15Z,-3.1,Pa",
      "AIIR-204,1970-01-01T00:00:00Z,500,Pa,open",
      "AIIR-204,2026-12-03T10:00:25Z,-2.9,Pa,OPEN",
    ].join("\r\n");
    const { readings, problems } = parsePressureCsv(csv);
    expect(readings.map((r) => [r.measuredAt.toISOString(), r.door])).toEqual([
      ["2026-12-03T10:00:00.000Z", "closed"],
      ["2026-12-03T10:00:25.000Z", "open"],
    ]);
    expect(problems.map((p) => [p.line, p.field])).toEqual([
      [4, "monitor_id"],
      [6, "measured_at"],
      [6, "pressure"],
      [6, "unit"],
      [6, "door"],
      [7, "row"],
      [8, "measured_at"],
      [8, "pressure"],
    ]);
    expect(problems.find((p) => p.line === 6 && p.field === "pressure")?.message).toBe(
      "Use a point for decimals, such as -3.1.",
    );
    expect(problems.find((p) => p.line === 7)?.message).toBe("4 cells where the header has 5.");
  });

  it("when the header is wrong, then the header line names the missing, unknown or repeated columns and no row is read", () => {
    const { readings, problems } = parsePressureCsv(
      "monitor_id,measured_at,presure,unit,unit\nAIIR-204,2026-12-03T10:00:00Z,-3,Pa,Pa\n",
    );
    expect(readings).toEqual([]);
    expect(problems).toEqual([
      { line: 1, field: "presure", message: expect.stringMatching(/^Unknown column/) },
      { line: 1, field: "pressure", message: "Missing column." },
      { line: 1, field: "unit", message: "Named twice in the header." },
    ]);
  });

  it("when the file is not CSV at all or is empty, then the problem names the file and the line", () => {
    const unclosed = parsePressureCsv(
      'monitor_id,measured_at,pressure,unit\nAIIR-204,2026-12-03T10:00:00Z,"-3,Pa\n',
    );
    expect(unclosed.readings).toEqual([]);
    expect(unclosed.problems).toEqual([
      { line: 2, field: "file", message: expect.stringMatching(/Not readable as CSV/) },
    ]);
    expect(parsePressureCsv("").problems).toEqual([
      { line: 1, field: "file", message: "The file is empty." },
    ]);
  });

  it("when a file has more than 10,000 rows, then it is refused at the first row too many", () => {
    const row = "AIIR-204,2026-12-03T10:00:00Z,-3,Pa";
    const csv = ["monitor_id,measured_at,pressure,unit", ...Array(10_001).fill(row)].join("\n");
    expect(parsePressureCsv(csv).problems).toEqual([
      { line: 10_002, field: "file", message: "At most 10,000 readings in one upload." },
    ]);
  });
});
