import { createServer, type AddressInfo, type Server } from "node:net";

import { Aedes } from "aedes";

export interface MqttBroker {
  readonly port: number;
  /** `mqtt://127.0.0.1:<port>` */
  readonly url: string;
  stop: () => Promise<void>;
}

/**
 * A local MQTT broker on 127.0.0.1 for the demo and the tests: what a building-automation gateway
 * would publish monitors' readings to. It keeps sessions and QoS 1 messages in memory only.
 */
export async function startMqttBroker(options: { port?: number } = {}): Promise<MqttBroker> {
  const broker = await Aedes.createBroker();
  const server: Server = createServer(broker.handle);
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 0, "127.0.0.1", () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    port,
    url: `mqtt://127.0.0.1:${port}`,
    async stop() {
      await new Promise<void>((resolve) => broker.close(() => resolve()));
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
      });
    },
  };
}
