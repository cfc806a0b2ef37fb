import { pino, type Logger } from "pino";

export function createLogger(level: string): Logger {
  return pino({
    level,
    base: { service: "lintel" },
    redact: {
      paths: ["req.headers.cookie", 'res.headers["set-cookie"]', "password", "*.password"],
      censor: "[redacted]",
    },
  });
}
