import sharp from 'sharp';
import { makeThumbnail, type ProofFile } from '../server/modules/deliveries/proof-files';

/** A signature drawn for the demo: a few pen strokes, not anyone's hand. */
const SIGNATURE_SVG = `<svg xmlns="http://www.w3.org/2000/svg" width="600" height="200" viewBox="0 0 600 200">
  <rect width="600" height="200" fill="#ffffff"/>
  <path d="M40 140 C 70 40, 110 40, 120 120 S 170 170, 190 90 C 200 60, 230 60, 235 120 C 240 160, 270 150, 290 100 C 300 80, 330 70, 340 110 S 380 160, 420 90 C 440 60, 470 70, 480 120 C 488 150, 520 140, 560 100"
        fill="none" stroke="#1f2a5a" stroke-width="5" stroke-linecap="round" stroke-linejoin="round"/>
  <path d="M60 165 L 540 160" stroke="#1f2a5a" stroke-width="2" stroke-linecap="round"/>
</svg>`;

/** A drawing made for the demo in place of a photo: a roof with its stacks landed on both slopes. */
const DROP_SCENE_SVG = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="800" viewBox="0 0 1200 800">
  <rect width="1200" height="800" fill="#cfe0ea"/>
  <rect y="600" width="1200" height="200" fill="#7d8b5a"/>
  <rect x="250" y="380" width="700" height="260" fill="#b9a48a"/>
  <polygon points="200,390 600,140 1000,390" fill="#55606b"/>
  ${Array.from({ length: 6 }, (_, i) => `<rect x="${300 + i * 100}" y="${330 - (i < 3 ? i : 5 - i) * 40}" width="40" height="30" fill="#8a4b32"/>`).join('')}
  <rect x="80" y="560" width="160" height="90" fill="#a57a45"/>
  <rect x="80" y="540" width="160" height="20" fill="#6b4f2e"/>
  <text x="600" y="760" font-family="sans-serif" font-size="32" text-anchor="middle" fill="#ffffff">Demo picture: stacks spread along both slopes</text>
</svg>`;

/** The demo's proof files: a PNG signature and one JPEG photo with its thumbnail. */
export async function demoProofFiles(): Promise<ProofFile[]> {
  const signature = await sharp(Buffer.from(SIGNATURE_SVG)).png().toBuffer();
  const photo = await sharp(Buffer.from(DROP_SCENE_SVG)).jpeg({ quality: 80 }).toBuffer();
  return [
    { kind: 'signature', position: 0, content_type: 'image/png', data: signature, thumbnail: null },
    { kind: 'photo', position: 1, content_type: 'image/jpeg', data: photo, thumbnail: await makeThumbnail(photo) },
  ];
}
