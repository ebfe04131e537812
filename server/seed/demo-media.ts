/**
 * Demo pictures for the invented Kestrel Quay project: a site plan for its pits and two drawn "photos"
 * (a site view and the pit with its kentledge) for the simulated rig's pit, so the location page, the
 * console and the report have something to show. Drawn as SVG and rasterised with sharp; captions say
 * they are drawings.
 */
import sharp from 'sharp';
import type { PhotoKind } from '../../shared/schemas/photos';
import { storeUpload, uploadDir } from '../http/uploads';
import { Photo } from '../models/photo';
import { Project } from '../models/project';
import { TestLocation } from '../models/test-location';
import { User } from '../models/user';
import { PhotoFiles, photoFileColumns, processPhoto } from '../services/photos';

const SITE_PLAN = `<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1000" viewBox="0 0 1600 1000">
  <rect width="1600" height="1000" fill="#fbfaf6"/>
  <rect x="0" y="860" width="1600" height="90" fill="#d9d6cc"/>
  <text x="40" y="915" font-family="sans-serif" font-size="30" fill="#333">QUAYSIDE ROAD</text>
  <path d="M120 120 H1480 V820 H120 Z" fill="none" stroke="#c1121f" stroke-width="6" stroke-dasharray="24 12"/>
  <rect x="160" y="160" width="420" height="260" fill="#cfd6df" stroke="#333" stroke-width="4"/>
  <text x="190" y="300" font-family="sans-serif" font-size="30" fill="#222">Existing unit (phase 1)</text>
  <rect x="360" y="470" width="960" height="300" fill="none" stroke="#1f4e8c" stroke-width="5"/>
  <text x="560" y="640" font-family="sans-serif" font-size="32" fill="#1f4e8c">Proposed warehouse (phase 2)</text>
  <rect x="760" y="820" width="160" height="40" fill="#bbb"/>
  <text x="940" y="850" font-family="sans-serif" font-size="24" fill="#333">site entrance</text>
  <g transform="translate(1440 210)"><path d="M0 -60 L22 20 L0 6 L-22 20 Z" fill="#222"/><text x="-12" y="56" font-family="sans-serif" font-size="34">N</text></g>
  <g transform="translate(1180 120)"><rect width="250" height="14" fill="#222"/><rect width="125" height="14" fill="#fff" stroke="#222"/>
    <text x="0" y="46" font-family="sans-serif" font-size="22">0</text><text x="200" y="46" font-family="sans-serif" font-size="22">50 m</text></g>
  <text x="40" y="985" font-family="sans-serif" font-size="22" fill="#555">Kestrel Quay, plot 7 — demo drawing, not to be scaled</text>
</svg>`;

const SITE_VIEW = `<svg xmlns="http://www.w3.org/2000/svg" width="1600" height="1200" viewBox="0 0 1600 1200">
  <defs><linearGradient id="sky" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#9cc3e6"/><stop offset="1" stop-color="#e4eef6"/></linearGradient></defs>
  <rect width="1600" height="620" fill="url(#sky)"/>
  <rect y="600" width="1600" height="600" fill="#a58b62"/>
  <path d="M0 640 Q400 590 800 630 T1600 620 V1200 H0 Z" fill="#9a7f55"/>
  <rect x="80" y="380" width="520" height="240" fill="#b9c3cc" stroke="#59636b" stroke-width="6"/>
  <path d="M900 640 Q1080 430 1280 640 Z" fill="#7e6544"/>
  <rect x="620" y="760" width="300" height="150" fill="#5a4630"/>
  <rect x="650" y="700" width="240" height="70" fill="#8d8d8d" stroke="#444" stroke-width="4"/>
  <rect x="1320" y="520" width="180" height="110" fill="#e0a100" stroke="#333" stroke-width="5"/>
  <circle cx="1350" cy="650" r="30" fill="#222"/><circle cx="1470" cy="650" r="30" fill="#222"/>
  <text x="40" y="1160" font-family="sans-serif" font-size="34" fill="#fff">Drawing for the demo: looking north across plot 7 towards PLT-03</text>
</svg>`;

const PIT_VIEW = `<svg xmlns="http://www.w3.org/2000/svg" width="1200" height="1600" viewBox="0 0 1200 1600">
  <rect width="1200" height="1600" fill="#8f7650"/>
  <rect x="200" y="700" width="800" height="800" fill="#6b5536"/>
  <rect x="150" y="180" width="900" height="80" fill="#7a5b3a" stroke="#3d2c1a" stroke-width="5"/>
  <g fill="#b8b8b0" stroke="#555" stroke-width="5">
    <rect x="170" y="20" width="270" height="160"/><rect x="465" y="20" width="270" height="160"/><rect x="760" y="20" width="270" height="160"/>
  </g>
  <rect x="560" y="260" width="80" height="80" fill="#c1121f"/>
  <rect x="530" y="340" width="140" height="200" fill="#355c7d" stroke="#1b2f40" stroke-width="5"/>
  <rect x="580" y="540" width="40" height="820" fill="#9aa1a6" stroke="#555" stroke-width="4"/>
  <rect x="450" y="1360" width="300" height="40" fill="#3a3a3a"/>
  <rect x="250" y="1330" width="20" height="60" fill="#eee"/><rect x="930" y="1330" width="20" height="60" fill="#eee"/>
  <path d="M260 1330 V1200 H420" fill="none" stroke="#ddd" stroke-width="8"/><path d="M940 1330 V1200 H780" fill="none" stroke="#ddd" stroke-width="8"/>
  <text x="40" y="1560" font-family="sans-serif" font-size="34" fill="#fff">Drawing for the demo: 300 mm plate, jack under the kentledge</text>
</svg>`;

const raster = (svg: string, to: 'png' | 'jpeg') => {
  const img = sharp(Buffer.from(svg));
  return (to === 'png' ? img.png() : img.jpeg({ quality: 85 })).toBuffer();
};

async function addPhoto(files: PhotoFiles, locationId: number, kind: PhotoKind, caption: string, svg: string, uploadedBy: number | null) {
  const processed = await processPhoto({ buffer: await raster(svg, 'jpeg') });
  await Photo.create({
    locationId,
    runId: null,
    kind,
    caption,
    ...photoFileColumns(processed, await files.save(processed)),
    uploadedBy,
  });
}

/** Adds the demo pictures once, to a freshly seeded demo; later starts leave what users changed alone. */
export async function seedDemoMedia(dataDir: string): Promise<void> {
  const project = await Project.findOne({ where: { code: 'KQ-DC2' } });
  if (!project) return;
  const pits = await TestLocation.findAll({ where: { projectId: project.id } });
  if (pits.some((p) => p.sitePlanFile) || (await Photo.count()) > 0) return;
  const plan = await storeUpload({ buffer: await raster(SITE_PLAN, 'png') }, uploadDir(dataDir, 'site-plans'), ['image/png']);
  for (const pit of pits) await pit.update({ sitePlanFile: plan });
  const demoPit = pits.find((p) => p.pitId === 'PLT-03');
  if (!demoPit) return;
  const operator = await User.findOne({ where: { role: 'operator' } });
  const files = new PhotoFiles(dataDir);
  await addPhoto(files, demoPit.id, 'site', 'Looking north across plot 7 to PLT-03 (drawing)', SITE_VIEW, operator?.id ?? null);
  await addPhoto(files, demoPit.id, 'pit', 'PLT-03 set up: plate, jack and kentledge (drawing)', PIT_VIEW, operator?.id ?? null);
}
