import sharp from "sharp";

import type { ConstructionClass, FixtureKind, ZoneType } from "@shared/zones";

import type { Tx } from "../db/client";
import { fixtures, floors, spaces, suites } from "../db/schema/index";
import { recordChange } from "../lib/change-log";
import { storeImage } from "../lib/images";
import type { Storage } from "../lib/storage";

// Demo floor plans, drawn here: a corridor across the middle, isolation suites above and below.
// 1600 × 1000 plan units at 0.02 m per unit (32 m × 20 m).
const width = 1600;
const height = 1000;
const metresPerUnit = 0.02;
const suiteWidth = 300;

type Box = [number, number, number, number];
const box = ([x1, y1, x2, y2]: Box): [number, number][] => [
  [x1, y1],
  [x2, y1],
  [x2, y2],
  [x1, y2],
];

interface SuitePlan {
  number: string;
  top: boolean;
  x: number;
  constructionClass: ConstructionClass;
}

export interface DemoFloorPlan {
  building: string;
  level: number;
  name: string;
  suites: SuitePlan[];
  /** A temporary doffing area in a corridor bay, with its two hand-rub stations set too close. */
  corridorBay?: boolean;
}

function suiteGeometry(suite: SuitePlan) {
  const x = suite.x;
  // Top suites: room above the anteroom; bottom suites mirror them below the corridor.
  const y = (top: number, bottom: number) => (suite.top ? top : bottom);
  const room: Box = suite.top ? [x, 80, x + suiteWidth, 330] : [x, 670, x + suiteWidth, 920];
  const ante: Box = suite.top
    ? [x + 160, 330, x + suiteWidth, 450]
    : [x + 160, 550, x + suiteWidth, 670];
  const doff: Box = suite.top ? [x + 168, 338, x + 292, 442] : [x + 168, 558, x + 292, 662];
  const don: Box = suite.top ? [x + 10, 340, x + 150, 450] : [x + 10, 550, x + 150, 660];
  const items: { zone: ZoneType; kind: FixtureKind; at: [number, number]; label?: string }[] = [
    { zone: "donning_zone", kind: "hand_rub_station", at: [x + 30, y(360, 640)] },
    {
      zone: "donning_zone",
      kind: "ppe_stock",
      at: [x + 75, y(365, 635)],
      label: "Respirators, gowns, shields, gloves",
    },
    { zone: "donning_zone", kind: "clean_chair", at: [x + 125, y(430, 570)] },
    { zone: "donning_zone", kind: "signage", at: [x + 40, y(430, 570)], label: "Putting-on order" },
    { zone: "donning_zone", kind: "mirror", at: [x + 90, y(430, 570)] },
    { zone: "doffing_area", kind: "hand_rub_station", at: [x + 185, y(355, 645)] },
    {
      zone: "doffing_area",
      kind: "hand_rub_station",
      at: [x + 275, y(425, 575)],
      label: "By the exit",
    },
    { zone: "doffing_area", kind: "dirty_chair", at: [x + 230, y(360, 640)] },
    { zone: "doffing_area", kind: "hands_free_bin", at: [x + 275, y(360, 640)] },
    { zone: "doffing_area", kind: "glove_supply", at: [x + 190, y(425, 575)] },
    { zone: "doffing_area", kind: "wipes", at: [x + 230, y(425, 575)] },
    { zone: "isolation_room", kind: "pressure_monitor", at: [x + 270, y(310, 690)] },
    {
      zone: "isolation_room",
      kind: "signage",
      at: [x + 230, y(310, 690)],
      label: "Airborne precautions",
    },
  ];
  return { room, ante, doff, don, items };
}

function drawPlan(plan: DemoFloorPlan): string {
  const walls: string[] = [];
  const rect = ([x1, y1, x2, y2]: Box, fill: string) =>
    `<rect x="${x1}" y="${y1}" width="${x2 - x1}" height="${y2 - y1}" fill="${fill}" stroke="#3b4650" stroke-width="6"/>`;
  walls.push(`<rect x="0" y="0" width="${width}" height="${height}" fill="#f7f5f0"/>`);
  walls.push(`<rect x="20" y="450" width="${width - 40}" height="100" fill="#e7e3da"/>`);
  walls.push(
    `<rect x="20" y="40" width="${width - 40}" height="920" fill="none" stroke="#2a323a" stroke-width="10"/>`,
  );
  for (const suite of plan.suites) {
    const g = suiteGeometry(suite);
    walls.push(rect(g.room, "#fdfcf9"), rect(g.ante, "#f4f1ea"));
    // Door gaps: room → anteroom, anteroom → corridor.
    const doorY = suite.top ? 330 : 670;
    walls.push(
      `<line x1="${suite.x + 200}" y1="${doorY}" x2="${suite.x + 260}" y2="${doorY}" stroke="#fdfcf9" stroke-width="8"/>`,
    );
    const corridorY = suite.top ? 450 : 550;
    walls.push(
      `<line x1="${suite.x + 190}" y1="${corridorY}" x2="${suite.x + 250}" y2="${corridorY}" stroke="#e7e3da" stroke-width="8"/>`,
    );
    // Bed outline in the room.
    const bedY = suite.top ? 120 : 760;
    walls.push(
      `<rect x="${suite.x + 60}" y="${bedY}" width="90" height="140" rx="10" fill="none" stroke="#9aa3ab" stroke-width="3"/>`,
    );
  }
  if (plan.corridorBay)
    walls.push(
      `<rect x="900" y="455" width="110" height="90" fill="#efe9dc" stroke="#8a6d3b" stroke-width="4" stroke-dasharray="12 8"/>`,
    );
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${walls.join("")}</svg>`;
}

/** Draws, stores and places one demo floor: plan image, scale, suites, spaces and fixtures. */
export async function createDemoFloor(
  tx: Tx,
  storage: Storage,
  siteId: string,
  plan: DemoFloorPlan,
): Promise<void> {
  const png = await sharp(Buffer.from(drawPlan(plan)))
    .png()
    .toBuffer();
  const image = await storeImage(
    { db: tx, storage },
    { siteId, uploadedBy: null, buffer: png, field: "plan", maxSide: 4096 },
  );
  const [floor] = await tx
    .insert(floors)
    .values({
      siteId,
      building: plan.building,
      level: plan.level,
      name: plan.name,
      planImageId: image.id,
      planWidth: width,
      planHeight: height,
      metresPerUnit,
      scaleReference: {
        a: { x: 20, y: 500 },
        b: { x: 1580, y: 500 },
        distanceMetres: 1560 * metresPerUnit,
      },
    })
    .returning({ id: floors.id });
  const floorId = floor!.id;

  for (const suitePlan of plan.suites) {
    const g = suiteGeometry(suitePlan);
    const [suite] = await tx
      .insert(suites)
      .values({ floorId, name: `Suite ${suitePlan.number}` })
      .returning({ id: suites.id });
    const area = (g.room[2] - g.room[0]) * (g.room[3] - g.room[1]) * metresPerUnit ** 2;
    const zones: { zone: ZoneType; name: string; polygon: [number, number][]; extra?: object }[] = [
      {
        zone: "isolation_room",
        name: `Isolation room ${suitePlan.number}`,
        polygon: box(g.room),
        extra: {
          constructionClass: suitePlan.constructionClass,
          floorAreaM2: area,
          ceilingHeightM: 2.7,
          volumeM3: Math.round(area * 2.7 * 10) / 10,
        },
      },
      { zone: "anteroom", name: `Anteroom ${suitePlan.number}`, polygon: box(g.ante) },
      { zone: "doffing_area", name: `Doffing area ${suitePlan.number}`, polygon: box(g.doff) },
      { zone: "donning_zone", name: `Donning zone ${suitePlan.number}`, polygon: box(g.don) },
    ];
    const spaceIds = new Map<ZoneType, string>();
    for (const zone of zones) {
      const [space] = await tx
        .insert(spaces)
        .values({
          floorId,
          siteId,
          suiteId: suite!.id,
          zoneType: zone.zone,
          name: zone.name,
          number: suitePlan.number,
          polygon: zone.polygon,
          ...zone.extra,
        })
        .returning({ id: spaces.id });
      spaceIds.set(zone.zone, space!.id);
    }
    for (const item of g.items) {
      await tx.insert(fixtures).values({
        spaceId: spaceIds.get(item.zone)!,
        siteId,
        kind: item.kind,
        x: item.at[0],
        y: item.at[1],
        label: item.label ?? null,
      });
    }
  }

  if (plan.corridorBay) {
    const [space] = await tx
      .insert(spaces)
      .values({
        floorId,
        siteId,
        zoneType: "doffing_area",
        name: "Temporary doffing bay",
        number: "C1",
        polygon: box([900, 455, 1010, 545]),
      })
      .returning({ id: spaces.id });
    // 45 units = 0.90 m apart: closer than the 48 in the fire code asks, so the map flags it.
    for (const [kind, x, y] of [
      ["hand_rub_station", 920, 480],
      ["hand_rub_station", 965, 480],
      ["dirty_chair", 990, 525],
      ["hands_free_bin", 920, 525],
    ] as const) {
      await tx.insert(fixtures).values({ spaceId: space!.id, siteId, kind, x, y });
    }
  }

  await recordChange(
    tx,
    { userId: null, requestId: "demo-data" },
    {
      action: "floor.created",
      entity: "floor",
      entityId: floorId,
      siteId,
      after: { building: plan.building, level: plan.level, name: plan.name },
    },
  );
}
