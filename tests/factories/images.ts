import sharp from "sharp";

/** A JPEG carrying camera and GPS metadata (latitude 50°43′N, longitude 3°31′W). */
export function jpegWithGps(
  options: { width?: number; height?: number; colour?: string } = {},
): Promise<Buffer> {
  return sharp({
    create: {
      width: options.width ?? 640,
      height: options.height ?? 480,
      channels: 3,
      background: options.colour ?? "#b04a3a",
    },
  })
    .jpeg()
    .withExif({
      IFD0: { Make: "WardCam", Model: "Audit 1" },
      IFD3: {
        GPSLatitudeRef: "N",
        GPSLatitude: "50/1 43/1 0/1",
        GPSLongitudeRef: "W",
        GPSLongitude: "3/1 31/1 0/1",
      },
    })
    .toBuffer();
}

/** A JPEG stored sideways with an EXIF orientation of 6 (rotate 90° to view). */
export function sidewaysJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 300, height: 100, channels: 3, background: "#2a7275" } })
    .jpeg()
    .withMetadata({ orientation: 6 })
    .toBuffer();
}

export function pngPlan(width = 800, height = 500): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: "#f7f5f0" } })
    .png()
    .toBuffer();
}

/** Random noise survives compression, so this many bytes reach the server. */
export function largeRandomFile(bytes: number): Buffer {
  const buffer = Buffer.alloc(bytes);
  for (let i = 0; i < bytes; i += 4) buffer.writeUInt32LE((Math.random() * 0xffffffff) >>> 0, i);
  return buffer;
}
