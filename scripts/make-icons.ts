// Makes the app's PNG icons (public/icon-*.png) from the favicon, for the web app manifest:
// run `npx tsx scripts/make-icons.ts` after changing src/assets/favicon.svg and commit the PNGs.
// The maskable icon keeps the drop inside the middle 80 % that every launcher's mask leaves visible.
import { readFileSync } from "node:fs";
import sharp from "sharp";

const svg = readFileSync(new URL("../src/assets/favicon.svg", import.meta.url));
const out = (name: string) => new URL(`../public/${name}`, import.meta.url).pathname;

for (const size of [192, 512]) {
  await sharp(svg, { density: (72 * size) / 32 })
    .resize(size, size)
    .png()
    .toFile(out(`icon-${size}.png`));
}

const inner = Math.round(512 * 0.7);
const drop = await sharp(svg, { density: (72 * inner) / 32 })
  .resize(inner, inner)
  .png()
  .toBuffer();
await sharp({ create: { width: 512, height: 512, channels: 4, background: "#16232e" } })
  .composite([{ input: drop, gravity: "center" }])
  .png()
  .toFile(out("icon-maskable-512.png"));

await sharp(svg, { density: (72 * 180) / 32 })
  .resize(180, 180)
  .flatten({ background: "#16232e" })
  .png()
  .toFile(out("apple-touch-icon.png"));
