// npm run bench:frames — frame work of the participant task and the participant route's script size.
// 1. Script size: the scripts the /s/[token] page loads (from its HTML), each fetched and
//    gzipped (zlib level 9 would flatter; level 6, as servers commonly use): total KB.
// 2. (test builds only, NEXT_PUBLIC_YAWPOINT_TEST_SOURCES=1) Frame work in headless Chromium at
//    the display's refresh with the simulated participant as the motion source: the time spent
//    inside each requestAnimationFrame callback of the task (drawing, timers), for every frame of
//    three sequences, per sequence p50/p99/max, and samples lost (delivered by the source but not
//    in the recorded stream, plus samples the engine dropped). `--bundle-only` skips part 2.
import { gzipSync } from "node:zlib";
import { chromium } from "@playwright/test";
import { createSessionStudy, fixtureDb, motionDesign } from "../../tests/e2e/fixtures/session-study";
import { passChecks } from "../../tests/e2e/fixtures/session-flow";
import { median, quantile, startServer } from "../../tests/e2e/fixtures/session-server";

const bundleOnly = process.argv.includes("--bundle-only");
const port = Number(process.env.PORT ?? 3204);
const server = await startServer(port);
const db = fixtureDb();
try {
  const fx = await createSessionStudy(db, `Frame bench ${Date.now()}`, { ...motionDesign, minBreakSeconds: 0, perConditionItems: [] }, 1);
  const token = fx.participants[0]!.token;
  const html = await (await fetch(`${server.url}/s/${token}`)).text();
  const srcs = [...html.matchAll(/<script[^>]+src="([^"]+)"/g)].map((m) => m[1]!);
  let raw = 0, gz = 0;
  const files: Array<{ src: string; gz: number }> = [];
  for (const src of new Set(srcs)) {
    const body = Buffer.from(await (await fetch(new URL(src, server.url))).arrayBuffer());
    const size = gzipSync(body, { level: 6 }).length;
    raw += body.length;
    gz += size;
    files.push({ src, gz: size });
  }
  // the largest files first, so a regression points at its chunk
  for (const f of files.sort((x, y) => y.gz - x.gz)) console.log(`  ${(f.gz / 1024).toFixed(1).padStart(6)} KB gzipped  ${f.src}`);
  const inline = [...html.matchAll(/<script(?![^>]*src=)[^>]*>([\s\S]*?)<\/script>/g)].reduce((a, m) => a + gzipSync(Buffer.from(m[1]!)).length, 0);
  console.log(`participant route /s/[token]: ${new Set(srcs).size} script files, ${(raw / 1024).toFixed(1)} KB raw, ${(gz / 1024).toFixed(1)} KB gzipped (+ ${(inline / 1024).toFixed(1)} KB gzipped inline); target ≤ 200 KB gzipped`);

  if (!bundleOnly) {
    const browser = await chromium.launch({ executablePath: "/usr/bin/chromium", headless: true });
    const page = await (await browser.newContext({ viewport: { width: 1280, height: 800 }, bypassCSP: true })).newPage();
    page.setDefaultTimeout(30_000);
    await page.goto(`${server.url}/s/${token}?source=simulated`);
    await passChecks(page, { typedName: "Bench Person", motion: true });
    await page.waitForFunction(`(window.__yawpointFrames?.length ?? 0) >= 3`, undefined, { timeout: 120_000, polling: 500 });
    const runs = (await page.evaluate(`window.__yawpointFrames.slice(0, 3)`)) as NonNullable<Window["__yawpointFrames"]>;
    // a string, so the bundler's helpers (keepNames) do not leak into the page
    const refresh = (await page.evaluate(`new Promise((resolve) => { const t = []; const f = (now) => { t.push(now); if (t.length < 61) requestAnimationFrame(f); else resolve(1000 / ((t[60] - t[0]) / 60)); }; requestAnimationFrame(f); })`)) as number;
    await browser.close();
    const p99s: number[] = [];
    runs.forEach((r, i) => {
      const lost = r.delivered - r.recorded + r.engineDropped;
      p99s.push(quantile(r.workMs, 0.99));
      console.log(`sequence ${i + 1}: ${r.workMs.length} frames, work p50 ${quantile(r.workMs, 0.5).toFixed(3)} ms, p99 ${quantile(r.workMs, 0.99).toFixed(3)} ms, max ${Math.max(...r.workMs).toFixed(3)} ms; samples delivered ${r.delivered}, recorded ${r.recorded}, lost ${lost}`);
    });
    console.log(`display refresh ≈ ${refresh.toFixed(1)} Hz; median p99 frame work ${median(p99s).toFixed(3)} ms (target ≤ 4 ms at 60 Hz)`);
  }
} finally {
  await db.destroy();
  server.stop();
}
