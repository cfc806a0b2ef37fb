import mqtt, { type MqttClient } from "mqtt";
import pg from "pg";

import { pressureTopic } from "../../shared/schemas/pressure-readings";
import { demoDriftingMonitorId } from "../../server/demo/pressure-monitors";

export interface SimulatedMonitor {
  monitorId: string;
  /** The room's usual differential, Pa (negative). */
  basePa: number;
  unit: "Pa" | "inH2O";
  /** Whether the monitor has a door contact (and so sends the door's state). */
  door: boolean;
  /** The demo room whose door opens now and then and which drifts positive once an hour. */
  drifts: boolean;
}

export interface PressureSimulator {
  stop: () => Promise<void>;
}

const paPerInH2O = 249.089;
const minuteMs = 60_000;
/** Once an hour, for this long, the drifting room loses its negative pressure. */
const driftMs = 7 * minuteMs;
/** The first drift begins this soon after the simulator starts, so a demo shows it early. */
const firstDriftAfterMs = 2 * minuteMs;

/** The demo's monitors, from the database: each demo isolation room's. */
export async function demoMonitors(databaseUrl: string): Promise<SimulatedMonitor[]> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    const { rows } = await client.query<{ monitor_id: string }>(
      "select monitor_id from pressure_monitors order by monitor_id",
    );
    return rows.map(({ monitor_id: monitorId }, index) => ({
      monitorId,
      basePa: -6 - (index % 5) * 1.5,
      // Orchard's monitors report in inches of water, as some building systems do.
      unit: monitorId.startsWith("orchard-") ? "inH2O" : "Pa",
      door: !monitorId.startsWith("orchard-"),
      drifts: monitorId === demoDriftingMonitorId,
    }));
  } finally {
    await client.end();
  }
}

/** The drifting room's differential at `elapsedMs` after start: a ramp up past zero and back. */
function driftPa(elapsedMs: number, basePa: number): number | null {
  const intoHour = (elapsedMs - firstDriftAfterMs + 60 * minuteMs) % (60 * minuteMs);
  if (intoHour >= driftMs) return null;
  const rise = Math.min(1, intoHour / (2 * minuteMs), (driftMs - intoHour) / (2 * minuteMs));
  return basePa + rise * (Math.abs(basePa) + 2.5);
}

/**
 * Publishes a reading every `intervalMs` for each monitor, as a building's gateway would: mostly
 * steady negative pressure with a little noise; the drifting room's door opens for half a minute
 * now and then (the pressure rises towards zero while it is open), and once an hour the room
 * drifts positive for several minutes.
 */
export async function startPressureSimulator(options: {
  brokerUrl: string;
  monitors: SimulatedMonitor[];
  intervalMs?: number;
  topicPrefix?: string;
}): Promise<PressureSimulator> {
  const intervalMs = options.intervalMs ?? 5_000;
  const client: MqttClient = await mqtt.connectAsync(options.brokerUrl, {
    clientId: `lintel-demo-monitors-${process.pid}`,
    reconnectPeriod: 2_000,
  });
  const started = Date.now();
  let doorOpenUntil = 0;
  const noise = () => (Math.random() - 0.5) * 1.2;

  const tick = () => {
    const now = Date.now();
    for (const monitor of options.monitors) {
      let pa = monitor.basePa + noise();
      let door: "open" | "closed" = "closed";
      if (monitor.drifts) {
        // About once every three minutes someone props the door for 20–40 s.
        if (now >= doorOpenUntil && Math.random() < intervalMs / (3 * minuteMs))
          doorOpenUntil = now + 20_000 + Math.random() * 20_000;
        if (now < doorOpenUntil) {
          door = "open";
          pa = -0.8 + noise() / 2;
        }
        const drift = driftPa(now - started, monitor.basePa);
        if (drift !== null) pa = drift + noise() / 2;
      }
      const pressure =
        monitor.unit === "Pa"
          ? Math.round(pa * 100) / 100
          : Math.round((pa / paPerInH2O) * 100_000) / 100_000;
      const payload = {
        measuredAt: new Date(now).toISOString(),
        pressure,
        unit: monitor.unit,
        ...(monitor.door ? { door } : {}),
      };
      client.publish(
        pressureTopic(monitor.monitorId, options.topicPrefix),
        JSON.stringify(payload),
        {
          qos: 1,
        },
      );
    }
  };
  tick();
  const timer = setInterval(tick, intervalMs);
  return {
    async stop() {
      clearInterval(timer);
      await client.endAsync();
    },
  };
}
