import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import bwipjs from 'bwip-js/node';
import { expect, test } from '@playwright/test';
import { createTestShop, userWithRole } from '../../fixtures/shops';
import { addPart, signInThroughApi } from '../catalogue/catalogue-api';

// Chromium's fake camera plays a Y4M file: here a Code 128 symbol of a part number, drawn from
// bwip-js's bar widths, so the whole path runs (camera → ZXing, loaded on demand, since Linux
// Chromium has no BarcodeDetector → lookup → part page).
const code = 'CAM-4210';
const width = 640;
const height = 480;

function writeBarcodeVideo(file: string) {
  const [symbol] = bwipjs.raw('code128', code, {});
  if (!symbol || !('sbs' in symbol)) throw new Error('no Code 128');
  const moduleWidth = 4;
  const total = symbol.sbs.reduce((a, b) => a + b, 0) * moduleWidth;
  const luma = Buffer.alloc(width * height, 235);
  let x = Math.floor((width - total) / 2);
  symbol.sbs.forEach((w, i) => {
    if (i % 2 === 0) for (let y = 140; y < 340; y += 1) luma.fill(16, y * width + x, y * width + x + w * moduleWidth);
    x += w * moduleWidth;
  });
  const chroma = Buffer.alloc((width / 2) * (height / 2), 128);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), luma, chroma, chroma]);
  fs.writeFileSync(file, Buffer.concat([Buffer.from(`YUV4MPEG2 W${width} H${height} F10:1 Ip A1:1 C420jpeg\n`), frame, frame]));
}

const video = path.join(os.tmpdir(), `tappet-camera-${process.pid}.y4m`);
writeBarcodeVideo(video);

test.use({
  permissions: ['camera'],
  launchOptions: {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
      '--use-fake-device-for-media-stream',
      '--use-fake-ui-for-media-stream',
      `--use-file-for-fake-video-capture=${video}`,
    ],
  },
});

test('on the lookup screen the camera reads a part number and opens the part', async ({ page }) => {
  test.setTimeout(90_000);
  const shop = await createTestShop({ roles: ['owner', 'mechanic'] });
  const shopId = shop.shop.id;
  await signInThroughApi(page.request, userWithRole(shop, 'owner').email, shop.password);
  const part = await addPart(page.request, shopId, { number: code, description: 'Camshaft follower', category: 'Engine' });
  await signInThroughApi(page.request, userWithRole(shop, 'mechanic').email, shop.password);

  await page.goto(`/shops/${shopId}/lookup`);
  await page.getByRole('button', { name: 'Scan with the camera' }).click();
  await expect(page.getByRole('dialog', { name: 'Scan a part number' })).toBeVisible();
  await expect(page).toHaveURL(new RegExp(`/shops/${shopId}/catalogue/${part.id}$`), { timeout: 30_000 });
  await expect(page.getByText('Camshaft follower').first()).toBeVisible();
});
