/**
 * The details of the measure workspace and the pages around it that a lab notices: the canvas
 * fits its frame with the handles and angle labels at the contact points, a magnifier while
 * dragging, the baseline moved by keyboard, zoom to the contact points; the warnings filter and
 * the removal buttons; a refused file's whole name; links from the dashboard; /audit in words;
 * the favicon.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { crc32 } from 'node:zlib';
import type { Browser, Page } from 'playwright-core';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PASSWORD } from '@/db/demo';
import { BASE_URL, launchBrowser, signIn } from './support/browser';

const FIXTURES = path.resolve(__dirname, '../../fixtures/drops');
const RUN = Date.now().toString(36);
/** Where fixtures/drops/manifest.json says the rendered drop meets the surface (image px). */
const CAP_60_CONTACTS = { left: [150, 330], right: [490, 330] } as const;
let browser: Browser;
let capFile: string;
let needleFile: string;
let blankFile: string;

/** The PNG with a text chunk naming this run, so the server takes it as a new file (own SHA-256). */
function tagPng(png: Buffer, tag: string): Buffer {
  const data = Buffer.from(`Comment\0${tag}`, 'latin1');
  const chunk = Buffer.alloc(12 + data.length);
  chunk.writeUInt32BE(data.length, 0);
  chunk.write('tEXt', 4, 'latin1');
  data.copy(chunk, 8);
  chunk.writeUInt32BE(crc32(chunk.subarray(4, 8 + data.length)), 8 + data.length);
  // After the 8-byte signature and the 25-byte IHDR chunk.
  return Buffer.concat([png.subarray(0, 33), chunk, png.subarray(33)]);
}

beforeAll(async () => {
  browser = await launchBrowser();
  const dir = mkdtempSync(path.join(tmpdir(), 'beadline-wd-'));
  capFile = path.join(dir, `wd-${RUN}-cap-60-noisy.png`);
  writeFileSync(capFile, tagPng(readFileSync(path.join(FIXTURES, 'cap-60-noisy.png')), `${RUN}-cap`));
  needleFile = path.join(dir, `wd-${RUN}-drop-105-needle.png`);
  writeFileSync(
    needleFile,
    tagPng(readFileSync(path.join(FIXTURES, 'drop-105-needle.png')), `${RUN}-needle`),
  );
  // A grey photo with no drop in it: the analysis finds nothing and says so.
  blankFile = path.join(dir, `wd-${RUN}-no-drop.png`);
  const grey = await sharp({
    create: { width: 640, height: 480, channels: 3, background: { r: 128, g: 128, b: 128 } },
  })
    .png()
    .toBuffer();
  writeFileSync(blankFile, tagPng(grey, `${RUN}-blank`));
});

afterAll(async () => {
  await browser?.close();
});

const table = (page: Page) => page.getByRole('table', { name: 'Photos' });
const mine = (page: Page) => table(page).getByRole('row').filter({ hasText: `wd-${RUN}-` });
const rowOf = (page: Page, file: string) =>
  table(page)
    .getByRole('row')
    .filter({ has: page.getByRole('button', { name: path.basename(file), exact: true }) });

type Rect = { x: number; y: number; width: number; height: number };
type Scene = {
  frameWidth: number;
  containerWidth: number;
  canvasWidth: number;
  canvasHeight: number;
  stageBox: Rect;
  stageOffset: { x: number; y: number };
  handles: Rect[];
  labels: { text: string; rect: Rect }[];
  magnifierRadii: number[];
};

/**
 * What the canvas has drawn, read from react-konva's own scene graph (window.Konva.stages):
 * the frame's inner width, the canvas size, the handles, the angle labels and the magnifier
 * lens, in screen pixels relative to the stage's top-left corner.
 */
function scene(page: Page): Promise<Scene> {
  return page.evaluate(() => {
    type Node = {
      getClientRect(): { x: number; y: number; width: number; height: number };
      findOne(selector: string): (Node & { text(): string }) | undefined;
      find(selector: string): (Node & { radius(): number })[];
    };
    type Stage = Node & {
      container(): HTMLDivElement;
      getLayers(): Node[];
      x(): number;
      y(): number;
    };
    const frame = document.querySelector<HTMLElement>('[data-testid="drop-canvas"]')!;
    const { stages } = (window as unknown as { Konva: { stages: Stage[] } }).Konva;
    const stage = stages.find((s) => frame.contains(s.container()))!;
    const canvas = stage.container().querySelector('canvas')!.getBoundingClientRect();
    const box = stage.container().getBoundingClientRect();
    const layers = stage.getLayers();
    return {
      frameWidth: frame.clientWidth,
      containerWidth: frame.parentElement!.clientWidth,
      canvasWidth: canvas.width,
      canvasHeight: canvas.height,
      stageBox: { x: box.x, y: box.y, width: box.width, height: box.height },
      stageOffset: { x: stage.x(), y: stage.y() },
      handles: ['.baseline-start', '.baseline-end'].map((name) => stage.findOne(name)!.getClientRect()),
      labels: stage.find('Label').map((label) => ({
        text: label.findOne('Text')!.text(),
        rect: label.getClientRect(),
      })),
      // The photo and overlay layers, and a third one only while a handle is dragged.
      magnifierRadii: layers.slice(2).flatMap((layer) => layer.find('Circle').map((c) => c.radius())),
    };
  });
}

const numbers = (text: string | null) => (text ?? '').split(',').map(Number);
const canvasOf = (page: Page) => page.getByTestId('drop-canvas');

/** Waits until the shown result is the full fit (not a draft) for the baseline on the canvas. */
async function settled(page: Page) {
  await page.waitForFunction(
    () => {
      const frame = document.querySelector<HTMLElement>('[data-testid="drop-canvas"]');
      if (!frame || frame.dataset.resultProvisional !== 'false') return false;
      const a = (frame.dataset.baseline ?? '').split(',').map(Number);
      const b = (frame.dataset.resultBaseline ?? '').split(',').map(Number);
      return a.length === 4 && b.length === 4 && a.every((v, i) => Math.abs(v - b[i]) < 0.01);
    },
    undefined,
    { timeout: 60_000 },
  );
}

/** Distance from a point to a rectangle (0 inside it). */
const distance = ([x, y]: readonly number[], r: Rect) =>
  Math.hypot(Math.max(r.x - x, 0, x - r.x - r.width), Math.max(r.y - y, 0, y - r.y - r.height));

describe('measure workspace details', () => {
  it('draws the photo inside its frame, handles and angle labels at the contact points; magnifier, keyboard and zoom', async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/measure`);
    await page.getByTestId('photo-input').setInputFiles([needleFile, blankFile, capFile]);
    await expect.poll(() => mine(page).count(), { timeout: 120_000, interval: 1000 }).toBe(3);
    await rowOf(page, capFile).getByRole('button', { name: path.basename(capFile), exact: true }).click();
    await expect.poll(() => page.getByTestId('shown-photo').textContent()).toContain(path.basename(capFile));
    await page.locator('[data-testid="drop-canvas"][data-result-left]').waitFor({ timeout: 120_000 });
    await settled(page);

    // The canvas fills its frame and no part of it is cut off by the frame's border.
    let drawn = await scene(page);
    expect(drawn.canvasWidth).toBeLessThanOrEqual(drawn.frameWidth);
    expect(drawn.canvasWidth).toBeGreaterThan(drawn.frameWidth - 2);
    expect(drawn.frameWidth).toBeLessThanOrEqual(drawn.containerWidth);

    // Both handles are wholly inside the canvas, at the contact points the photo was drawn with.
    for (const handle of drawn.handles) {
      expect(handle.x).toBeGreaterThanOrEqual(0);
      expect(handle.y).toBeGreaterThanOrEqual(0);
      expect(handle.x + handle.width).toBeLessThanOrEqual(drawn.canvasWidth);
      expect(handle.y + handle.height).toBeLessThanOrEqual(drawn.canvasHeight);
    }
    const handles = numbers(await canvasOf(page).getAttribute('data-handles'));
    expect(Math.hypot(handles[0] - CAP_60_CONTACTS.left[0], handles[1] - CAP_60_CONTACTS.left[1])).toBeLessThan(5);
    expect(Math.hypot(handles[2] - CAP_60_CONTACTS.right[0], handles[3] - CAP_60_CONTACTS.right[1])).toBeLessThan(5);

    // Each angle's label sits beside its contact point, outside the drop, and says its angle.
    const scale = Number(await canvasOf(page).getAttribute('data-scale'));
    const onScreen = (p: readonly number[]) => [
      p[0] * scale + drawn.stageOffset.x,
      p[1] * scale + drawn.stageOffset.y,
    ];
    const [leftLabel, rightLabel] = [...drawn.labels].sort((a, b) => a.rect.x - b.rect.x);
    expect(drawn.labels).toHaveLength(2);
    expect(leftLabel.text).toBe(await page.getByTestId('angle-left').textContent());
    expect(rightLabel.text).toBe(await page.getByTestId('angle-right').textContent());
    const left = onScreen(CAP_60_CONTACTS.left);
    const right = onScreen(CAP_60_CONTACTS.right);
    expect(distance(left, leftLabel.rect)).toBeLessThan(30);
    expect(distance(right, rightLabel.rect)).toBeLessThan(30);
    expect(leftLabel.rect.x + leftLabel.rect.width).toBeLessThanOrEqual(left[0]);
    expect(rightLabel.rect.x).toBeGreaterThanOrEqual(right[0]);

    // "Zoom to the contact points" magnifies the view and keeps both contact points in it.
    await page.getByRole('button', { name: 'Zoom to the contact points' }).click();
    await expect.poll(async () => Number(await canvasOf(page).getAttribute('data-scale'))).toBeGreaterThan(scale * 1.2);
    expect(await page.getByText(/Scroll to zoom \(1\.0×\)/).count()).toBe(0);
    const zoomed = await scene(page);
    const zoomScale = Number(await canvasOf(page).getAttribute('data-scale'));
    for (const p of [CAP_60_CONTACTS.left, CAP_60_CONTACTS.right]) {
      const x = p[0] * zoomScale + zoomed.stageOffset.x;
      const y = p[1] * zoomScale + zoomed.stageOffset.y;
      expect(x).toBeGreaterThan(0);
      expect(x).toBeLessThan(zoomed.canvasWidth);
      expect(y).toBeGreaterThan(0);
      expect(y).toBeLessThan(zoomed.canvasHeight);
    }
    await page.getByRole('button', { name: 'Fit to view' }).click();
    await page.getByText('Scroll to zoom (1.0×).').waitFor();
    drawn = await scene(page);

    // Dragging the right handle shows the magnifier until the handle is let go.
    expect(drawn.magnifierRadii).toEqual([]);
    const endHandle = drawn.handles[1];
    const grabX = drawn.stageBox.x + endHandle.x + endHandle.width / 2;
    const grabY = drawn.stageBox.y + endHandle.y + endHandle.height / 2;
    const rightBefore = await canvasOf(page).getAttribute('data-result-right');
    await page.mouse.move(grabX, grabY);
    await page.mouse.down();
    await page.mouse.move(grabX, grabY - 5 * scale, { steps: 6 });
    const dragging = await scene(page);
    expect(dragging.magnifierRadii.length).toBeGreaterThan(0);
    await page.mouse.up();
    await expect.poll(async () => (await scene(page)).magnifierRadii).toEqual([]);
    await settled(page);
    expect(await canvasOf(page).getAttribute('data-result-right')).not.toBe(rightBefore);

    // Keyboard: 2 picks the right handle, ↑ moves it 1 px a press, and the angles follow.
    await canvasOf(page).focus();
    await page.keyboard.press('2');
    expect(await canvasOf(page).getAttribute('data-selected-handle')).toBe('end');
    expect(
      await page.getByRole('button', { name: 'Right handle (2)' }).getAttribute('aria-pressed'),
    ).toBe('true');
    const beforeKeys = numbers(await canvasOf(page).getAttribute('data-handles'));
    const rightAngleBefore = Number(await canvasOf(page).getAttribute('data-result-right'));
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowUp');
    await expect
      .poll(async () => numbers(await canvasOf(page).getAttribute('data-handles'))[3])
      .toBeCloseTo(beforeKeys[3] - 3, 2);
    const afterKeys = numbers(await canvasOf(page).getAttribute('data-handles'));
    // The other three coordinates stay (a nudge keeps 3 decimals).
    for (const i of [0, 1, 2]) expect(afterKeys[i]).toBeCloseTo(beforeKeys[i], 2);
    await settled(page);
    const rightAngleAfter = Number(await canvasOf(page).getAttribute('data-result-right'));
    expect(Math.abs(rightAngleAfter - rightAngleBefore)).toBeGreaterThan(0.3);
    await context.close();
  }, 400_000);

  it('filters to the photos with warnings, removes the ticked ones and then all unsaved', async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/measure`);
    // The three unsaved photos of the test above come back.
    await expect.poll(() => mine(page).count(), { timeout: 60_000 }).toBe(3);
    await expect
      .poll(async () => (await mine(page).getByTestId('photo-state').allTextContents()).includes('Analysing'), {
        timeout: 300_000,
        interval: 2000,
      })
      .toBe(false);
    const stateOf = async (file: string) =>
      rowOf(page, file).getByTestId('photo-state').textContent();
    expect(await stateOf(blankFile)).toBe('No result');
    expect(await stateOf(capFile)).toBe('Analysed');
    const flagged: string[] = [];
    for (const file of [capFile, needleFile, blankFile]) {
      if (['No result', 'Check'].includes((await stateOf(file)) ?? '')) flagged.push(path.basename(file));
    }

    // Only the photos that failed or carry a warning stay listed; unticking the box brings all back.
    await page.getByLabel('Only photos with warnings').check();
    await expect
      .poll(async () =>
        (await mine(page).locator('td:nth-child(2) button').allTextContents()).sort(),
      )
      .toEqual(flagged.sort());
    expect(await rowOf(page, capFile).count()).toBe(0);
    await page.getByLabel('Only photos with warnings').uncheck();
    await expect.poll(() => mine(page).count()).toBe(3);

    // Tick only the photo without a drop and remove it.
    await page.getByLabel('Select all photos shown').uncheck();
    await rowOf(page, blankFile).getByLabel(`Select ${path.basename(blankFile)}`).check();
    await page.getByRole('button', { name: 'Remove ticked' }).click();
    const ask = page.getByRole('dialog', { name: 'Remove 1 ticked photo(s)?' });
    await ask.waitFor();
    expect(await ask.getByRole('listitem').allTextContents()).toEqual([path.basename(blankFile)]);
    await ask.getByRole('button', { name: 'Remove', exact: true }).click();
    await rowOf(page, blankFile).waitFor({ state: 'detached', timeout: 30_000 });
    expect(await mine(page).count()).toBe(2);

    // Remove every unsaved photo; a reload brings none of them back.
    await page.getByRole('button', { name: 'Remove all unsaved' }).click();
    const askAll = page.getByRole('dialog', { name: /^Remove \d+ unsaved photo\(s\)\?$/ });
    await askAll.waitFor();
    const listed = await askAll.getByRole('listitem').allTextContents();
    expect(listed).toEqual(expect.arrayContaining([path.basename(capFile), path.basename(needleFile)]));
    await askAll.getByRole('button', { name: 'Remove', exact: true }).click();
    await expect.poll(() => mine(page).count(), { timeout: 30_000 }).toBe(0);
    await page.reload();
    await page
      .getByText('Upload photos to start. Each one is analysed in your browser as soon as it arrives.')
      .waitFor({ timeout: 60_000 });
    expect(await mine(page).count()).toBe(0);
    await context.close();
  }, 500_000);

  it('shows a refused file’s whole name beside the reason', async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    await page.goto(`${BASE_URL}/measure`);
    const name = `bench-notebook-${RUN}-export-of-the-morning-series-with-the-contact-angles.txt`;
    await page.getByTestId('photo-input').setInputFiles({
      name,
      mimeType: 'text/plain',
      buffer: Buffer.from('not a photo'),
    });
    const uploads = page.getByRole('list', { name: 'Uploads' });
    const shown = uploads.getByText(name, { exact: true });
    await shown.waitFor();
    expect(await uploads.getByRole('status').textContent()).toContain('is not a PNG, JPEG, TIFF or BMP photo');
    // Nothing of the name is cut off: it wraps inside its box rather than being squeezed.
    const box = await shown.evaluate((el) => ({
      scrollWidth: el.scrollWidth,
      clientWidth: el.clientWidth,
      width: el.getBoundingClientRect().width,
      row: el.parentElement!.getBoundingClientRect().width,
    }));
    expect(box.scrollWidth).toBeLessThanOrEqual(box.clientWidth);
    expect(box.width).toBeGreaterThan(box.row / 2);
    await context.close();
  });
});

describe('pages around the workspace', () => {
  it('opens a drop page from the dashboard’s recent drops and the review list from its card', async () => {
    const context = await browser.newContext({ viewport: { width: 1440, height: 1000 } });
    const page = await context.newPage();
    await signIn(page, 'analyst@kestrel.example', DEMO_PASSWORD);
    const first = page.getByTestId('recent-drops').getByRole('link').first();
    const href = await first.getAttribute('href');
    expect(href).toMatch(/^\/drops\/[^/]+$/);
    await first.click();
    await page.waitForURL(`${BASE_URL}${href}`);
    const revisions = page.getByTestId('drop-revisions').getByRole('row');
    await revisions.first().waitFor();
    const cells = await revisions.first().getByRole('cell').allTextContents();
    expect(cells[1]).toMatch(/^\d{1,2} [A-Z][a-z]{2} \d{4}, \d{2}:\d{2} UTC$/);
    expect(cells[2]).not.toBe('');
    expect(['Young–Laplace', 'Circle', 'Polynomial', 'Ellipse', 'Height–width (θ/2)', 'Read by hand']).toContain(cells[3]);
    expect(['set by hand', 'found automatically']).toContain(cells[4]);

    await context.close();

    const reviewer = await (await browser.newContext()).newPage();
    await signIn(reviewer, 'reviewer@kestrel.example', DEMO_PASSWORD);
    await reviewer.getByTestId('pending-reviews-count').click();
    await reviewer.waitForURL(`${BASE_URL}/reviews`);
    await reviewer.getByRole('heading', { level: 1 }).waitFor();
    await reviewer.context().close();
  });

  it('writes the audit log’s details in words, not as JSON', async () => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await signIn(page, 'admin@kestrel.example', DEMO_PASSWORD);
    const code = `WD-${RUN.toUpperCase()}`;
    const response = await context.request.post(`${BASE_URL}/api/coatings`, {
      data: { code, name: 'Audit wording topcoat' },
      headers: { origin: BASE_URL },
    });
    expect(response.status()).toBe(201);
    await page.goto(`${BASE_URL}/audit`);
    const row = page.getByRole('row').filter({ hasText: `code: ${code}` });
    await row.first().waitFor();
    const details = (await row.first().getByRole('cell').last().textContent()) ?? '';
    expect(details).toContain('name: Audit wording topcoat');
    expect(details).not.toMatch(/[{}"]/);
    await context.close();
  });

  it('serves /favicon.ico as an icon, signed in or not', async () => {
    const context = await browser.newContext();
    const response = await context.request.get(`${BASE_URL}/favicon.ico`);
    expect(response.status()).toBe(200);
    expect(response.headers()['content-type']).toMatch(/^image\//);
    const body = await response.body();
    // The ICO header: reserved 0, type 1 (icon), at least one image.
    expect([...body.subarray(0, 4)]).toEqual([0, 0, 1, 0]);
    expect(body.readUInt16LE(4)).toBeGreaterThan(0);
    await context.close();
  });
});
