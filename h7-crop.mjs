import sharp from 'sharp';
const [f, top, h, out] = process.argv.slice(2);
const m = await sharp(f).metadata();
await sharp(f).extract({ left: 0, top: +top, width: m.width, height: Math.min(+h, m.height - +top) }).toFile(out);
