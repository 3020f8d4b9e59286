/**
 * Canvas plot benchmark in Debian's Chromium: the catalog page's sky and l–v plots (the real
 * components, bundled by Vite into a page of their own) with N points. Measures the first draw,
 * drag-box zooms and resets (time from releasing the pointer to the redrawn plot), and the
 * frame intervals while the pointer moves over a plot (the coordinate readout must not redraw
 * the points). Prints one JSON line. Run: `npm run bench:plots -- --points 1000000`.
 *
 * Target: each redraw within 100 ms of the input, the usual limit for a response to feel
 * instantaneous (Nielsen 1993, Usability Engineering, §5.5; common practice).
 */
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { build } from 'vite';
import type { Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';

const arg = (name: string, dflt: number) => {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : dflt;
};
const MEASURE = 'lanewise:scatter-draw';
const root = path.resolve(__dirname, '..', '..');

async function bundle(): Promise<string> {
  const out = fs.mkdtempSync(path.join(os.tmpdir(), 'lanewise-plots-'));
  await build({
    root: path.join(root, 'tests/bench/plots-page'),
    configFile: false,
    logLevel: 'error', // not the warnings about 'use client', which only Next.js reads
    resolve: { alias: { '@': root } },
    esbuild: { jsx: 'automatic' },
    define: { 'process.env.NODE_ENV': '"production"' },
    build: { outDir: out, emptyOutDir: true },
  });
  return out;
}

function serve(dir: string): Promise<http.Server> {
  const server = http.createServer((req, res) => {
    const file = path.join(
      dir,
      new URL(req.url ?? '/', 'http://x').pathname.replace(/\/$/, '/index.html'),
    );
    if (!file.startsWith(dir) || !fs.existsSync(file)) return void res.writeHead(404).end();
    res.writeHead(200, { 'content-type': file.endsWith('.js') ? 'text/javascript' : 'text/html' });
    fs.createReadStream(file).pipe(res);
  });
  return new Promise((resolve) => server.listen(0, '127.0.0.1', () => resolve(server)));
}

type Draw = { testId: string; points: number; start: number; end: number; ms: number };
const draws = (page: Page) =>
  page.evaluate(
    (name) =>
      performance.getEntriesByName(name).map((e) => {
        const m = e as PerformanceMeasure;
        const d = m.detail as { testId: string; points: number };
        return {
          testId: d.testId,
          points: d.points,
          start: m.startTime,
          end: m.startTime + m.duration,
          ms: m.duration,
        };
      }),
    MEASURE,
  );

async function waitForDraws(page: Page, count: number): Promise<Draw[]> {
  await page.waitForFunction(
    ([name, k]) => performance.getEntriesByName(name as string).length >= (k as number),
    [MEASURE, count],
    { timeout: 60_000 },
  );
  return draws(page);
}

const p95 = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return +s[Math.floor(0.95 * (s.length - 1))].toFixed(1);
};

async function main() {
  const n = arg('points', 1_000_000);
  const dir = await bundle();
  const server = await serve(dir);
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage({ viewport: { width: 1200, height: 1200 } });
    const { port } = server.address() as { port: number };
    await page.goto(`http://127.0.0.1:${port}/?points=${n}`);
    const first = await waitForDraws(page, 2);

    // Drag-box zooms on the sky plot, each followed by a reset.
    const sky = (await page.getByTestId('sky-plot').boundingBox())!;
    const reset = page.getByRole('button', { name: 'Reset zoom' }).first();
    const latencies: number[] = [];
    const zoomDraws: number[] = [];
    for (let i = 0; i < 5; i++) {
      const before = (await draws(page)).length;
      const x0 = sky.x + 100 + i * 60;
      const y0 = sky.y + 40;
      await page.mouse.move(x0, y0);
      await page.mouse.down();
      await page.mouse.move(x0 + 200, y0 + 120, { steps: 5 });
      await page.mouse.up();
      const after = await waitForDraws(page, before + 1);
      const drawn = after[after.length - 1];
      const released = await page.evaluate(() =>
        (window as unknown as { pointerUps: number[] }).pointerUps.at(-1)!,
      );
      latencies.push(drawn.end - released);
      zoomDraws.push(drawn.ms);
      await reset.click();
      const again = await waitForDraws(page, before + 2);
      zoomDraws.push(again[again.length - 1].ms);
    }

    // Pointer moving over the l–v plot: frame intervals, and no redraw of the points.
    const lv = (await page.getByTestId('lv-plot').boundingBox())!;
    const drawsBefore = (await draws(page)).length;
    // A string, not a function: tsx would wrap a named function in a helper the page lacks.
    await page.evaluate(`(() => {
      window.frames_ = [];
      window.recording = true;
      const tick = (t) => { window.frames_.push(t); if (window.recording) requestAnimationFrame(tick); };
      requestAnimationFrame(tick);
    })()`);
    for (let i = 0; i < 60; i++)
      await page.mouse.move(lv.x + 80 + i * 15, lv.y + 60 + (i % 10) * 20);
    const frames = await page.evaluate(() => {
      const w = window as unknown as { frames_: number[]; recording: boolean };
      w.recording = false;
      return w.frames_.slice(1).map((t, i) => t - w.frames_[i]);
    });
    const drawsDuringHover = (await draws(page)).length - drawsBefore;

    console.log(
      JSON.stringify({
        points: n,
        firstDrawMs: Object.fromEntries(first.slice(0, 2).map((d) => [d.testId, +d.ms.toFixed(1)])),
        zoomReleaseToDrawnP95Ms: p95(latencies),
        zoomOrResetDrawP95Ms: p95(zoomDraws),
        hoverFrameIntervalP95Ms: p95(frames),
        hoverFrames: frames.length,
        redrawsWhileHovering: drawsDuringHover,
        targetMs: 100,
      }),
    );
  } finally {
    await browser.close();
    server.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
