import { expect, test, type Page } from "@playwright/test";
import type { Knex } from "knex";
import { fixtureDb } from "./fixtures/session-study";
import { SensorWorld } from "./fixtures/inputs/sensorWorld";
import { finish, oneParticipant, PHONE, techniqueDesign } from "./fixtures/inputs/inputStudy";
import type { StudyDesignInput } from "../../lib/study/design";

// A participant on a phone (412 × 915 CSS px, touch): the steps a phone needs around the task.
// Outside references, named at each check: W3C Device Orientation and Motion (requestPermission
// needs transient activation), W3C Screen Wake Lock, WHATWG Fullscreen, W3C Screen Orientation,
// CSS Environment Variables (safe-area-inset-*), W3C Web App Manifest (display), the W3C
// Permissions API ("denied" for the sensors).

let db: Knex;
test.beforeAll(() => {
  db = fixtureDb();
});
test.afterAll(async () => {
  await db.destroy();
});
test.use({ viewport: { width: 412, height: 915 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2 });

/**
 * What the page asked of the browser, in order. Chromium has no `DeviceMotionEvent.requestPermission`
 * (iOS Safari has): a stand-in shaped as W3C Device Orientation and Motion §requestPermission() —
 * without transient activation the promise rejects with NotAllowedError — records whether a user
 * gesture was active. The others are the browser's own APIs, watched, not replaced.
 */
function watchPhoneApis(): void {
  const log: string[] = [];
  (window as unknown as { __phone: string[] }).__phone = log;
  (DeviceMotionEvent as unknown as { requestPermission: () => Promise<string> }).requestPermission = async () => {
    const active = navigator.userActivation.isActive;
    log.push(active ? "permission-in-gesture" : "permission-outside-gesture");
    if (!active) throw new DOMException("requestPermission needs a user gesture", "NotAllowedError");
    return "granted";
  };
  const add = EventTarget.prototype.addEventListener;
  EventTarget.prototype.addEventListener = function (this: EventTarget, type: string, ...rest: [EventListenerOrEventListenerObject | null, (boolean | AddEventListenerOptions)?]) {
    if (type === "devicemotion") log.push("sensors");
    return add.call(this, type, ...rest);
  };
  const gyro = (window as unknown as { Gyroscope?: { prototype: { start: () => void } } }).Gyroscope;
  if (gyro) {
    const start = gyro.prototype.start;
    gyro.prototype.start = function (this: unknown) {
      log.push("sensors");
      return start.call(this);
    };
  }
  const wl = navigator.wakeLock;
  const request = wl.request.bind(wl);
  wl.request = async (type?: "screen") => {
    log.push("wake-lock-asked");
    const s = await request(type);
    log.push("wake-lock-held");
    s.addEventListener("release", () => log.push("wake-lock-released"));
    return s;
  };
  const o = screen.orientation as ScreenOrientation & { lock: (x: string) => Promise<void> };
  const lock = o.lock.bind(o);
  o.lock = (x: string) => {
    log.push(`orientation-lock:${x}`);
    return lock(x);
  };
}

const phoneLog = (page: Page): Promise<string[]> => page.evaluate(() => [...(window as unknown as { __phone: string[] }).__phone]);

async function sensorsOn(page: Page): Promise<SensorWorld> {
  const world = new SensorWorld(await page.context().newCDPSession(page), { rateHz: PHONE.rateHz, biasDegPerS: PHONE.gyroBiasDegPerS, noiseSdDegPerS: PHONE.gyroNoiseSdDegPerS, seed: 5 });
  await world.enable();
  world.still("flat");
  world.start();
  return world;
}

test("motion on a phone: sensors only after a tap (also after a reload), wake lock and fullscreen during the task, every control explained and inside the safe area", async ({ page, context }) => {
  test.setTimeout(150_000);
  const design: StudyDesignInput = techniqueDesign("motion", "cursor", { selection: "button", config: { activation: "while-aiming" } });
  design.task = { ...design.task!, trialTimeLimitMs: 1000 };
  const p = await oneParticipant(db, "Phone steps", design);
  await page.addInitScript(watchPhoneApis);
  const world = await sensorsOn(page);
  const cdp = await context.newCDPSession(page);
  // a notch-less phone with a home indicator: 34 px at the bottom (CSS Environment Variables, safe-area-inset-bottom)
  await cdp.send("Emulation.setSafeAreaInsetsOverride" as never, { insets: { top: 24, bottom: 34, left: 0, right: 0 } } as never);
  await page.goto(`/s/${p.token}`);

  // W3C Web App Manifest: the participant pages link a manifest that asks for fullscreen, with icons that load
  const href = await page.locator("link[rel=manifest]").getAttribute("href");
  const manifest = (await (await page.request.get(href!)).json()) as { display: string; icons: Array<{ src: string; type: string }> };
  expect(manifest.display).toBe("fullscreen");
  for (const icon of manifest.icons) {
    const r = await page.request.get(icon.src);
    expect(r.status(), icon.src).toBe(200);
    expect(r.headers()["content-type"]).toContain(icon.type);
  }
  expect((await page.request.get((await page.locator("link[rel=apple-touch-icon]").getAttribute("href"))!)).status()).toBe(200);

  await expect(page.getByText("You will aim by turning your device")).toBeVisible();
  await page.getByRole("button", { name: "Continue" }).tap();
  for (const box of await page.getByRole("checkbox").all()) await box.check();
  await page.getByRole("button", { name: "I agree and take part" }).tap();
  await page.getByRole("button", { name: "Check my device" }).tap();
  await page.getByRole("button", { name: "Measure" }).tap({ timeout: 15_000 });
  await expect(page.getByRole("heading", { name: "How the task works" })).toBeVisible({ timeout: 15_000 });
  expect(await phoneLog(page)).not.toContain("permission-outside-gesture");

  // the instructions name each control of this technique on a touch screen (our wording; lib/runner/controls.ts)
  const card = page.getByTestId("controls-motion");
  await expect(card).toContainText("Turn your device to move the cross.");
  await expect(card).toContainText("To select, tap the Select button.");
  await expect(card).toContainText("hold the Pause button");
  await expect(card).toContainText("The aim moves only while you hold the Aim button");
  await expect(card).toContainText("The Recenter button makes the way you hold the device now the new starting point");
  // no practice in this study: no practice sentence, and the button says Start
  await expect(page.getByText("practice round")).toHaveCount(0);

  // a reload on the instructions: Start asks for the sensors again, inside its tap, before they start
  await page.reload();
  await page.getByRole("button", { name: "Start", exact: true }).tap();
  await expect(page.getByTestId("task-canvas")).toBeVisible();
  await expect.poll(() => phoneLog(page)).toContain("sensors");
  let log = await phoneLog(page);
  expect(log.indexOf("permission-in-gesture")).toBeGreaterThanOrEqual(0);
  expect(log.indexOf("permission-in-gesture")).toBeLessThan(log.indexOf("sensors"));
  expect(log).not.toContain("permission-outside-gesture");

  // WHATWG Fullscreen and W3C Screen Orientation: fullscreen from the tap, the present orientation locked
  await expect.poll(() => page.evaluate(() => document.fullscreenElement !== null)).toBe(true);
  expect(log).toContain(`orientation-lock:${await page.evaluate(() => screen.orientation.type)}`);
  // W3C Screen Wake Lock: held while the task runs
  await expect.poll(() => phoneLog(page)).toContain("wake-lock-held");

  // the on-screen controls sit inside the safe area (bottom inset 34 px) and on the screen
  for (const kind of ["select", "pause", "aim", "recenter"]) {
    const b = (await page.getByTestId(`control-${kind}`).boundingBox())!;
    expect(b.y + b.height, kind).toBeLessThanOrEqual(915 - 34);
    expect(b.x).toBeGreaterThanOrEqual(0);
    expect(b.x + b.width).toBeLessThanOrEqual(412);
  }
  // the header's withdraw button stays below the top inset (24 px)
  expect((await page.getByRole("button", { name: "Stop and withdraw" }).boundingBox())!.y).toBeGreaterThanOrEqual(24);
  await page.screenshot({ path: "test-results/phone-task.png" });

  // a reload mid-round (or the link in a new tab): a tap to continue, and nothing starts before it
  await page.reload();
  const gate = page.getByRole("button", { name: "Tap to continue" });
  await expect(gate).toBeVisible();
  await page.waitForTimeout(1500);
  // (the wake lock needs no gesture and may be held already)
  expect((await phoneLog(page)).filter((x) => !x.startsWith("wake-lock"))).toEqual([]);
  await page.screenshot({ path: "test-results/phone-resume.png" });
  await gate.tap();
  await expect(page.getByTestId("task-canvas")).toBeVisible();
  await expect.poll(() => phoneLog(page)).toContain("sensors");
  log = (await phoneLog(page)).filter((x) => !x.startsWith("wake-lock"));
  expect(log[0]).toBe("permission-in-gesture");

  // the round runs to its end (the first Select starts it; each movement then times out) and the session completes
  await page.getByTestId("control-select").tap();
  expect(await finish(page)).toBe(p.completionCode);
  // after the task: the wake lock released, fullscreen left
  await expect.poll(() => phoneLog(page)).toContain("wake-lock-released");
  expect(await page.evaluate(() => document.fullscreenElement)).toBeNull();
  await world.stop();
});

test("a refused motion permission says where to allow it again in that browser, and the check passes once allowed", async ({ browser }) => {
  test.setTimeout(90_000);
  // an Android phone's Chrome (its published User-Agent format)
  const context = await browser.newContext({
    viewport: { width: 412, height: 915 }, hasTouch: true, isMobile: true, deviceScaleFactor: 2,
    userAgent: "Mozilla/5.0 (Linux; Android 14; Pixel 8) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/156.0.0.0 Mobile Safari/537.36",
  });
  const page = await context.newPage();
  const p = await oneParticipant(db, "Phone refused", techniqueDesign("motion", "cursor"));
  const world = await sensorsOn(page);
  const browserCdp = await browser.newBrowserCDPSession();
  const { targetInfo } = await (await context.newCDPSession(page)).send("Target.getTargetInfo");
  const origin = `http://127.0.0.1:${process.env.PORT ?? 3100}`;
  // the site's sensor setting blocked, as the browser's own permission store holds it (W3C Permissions: "denied")
  const setSensors = (setting: "denied" | "granted") => browserCdp.send("Browser.setPermission", { permission: { name: "gyroscope" }, setting, origin, browserContextId: targetInfo.browserContextId });
  await setSensors("denied");
  await page.goto(`/s/${p.token}`);
  await page.getByRole("button", { name: "Continue" }).tap();
  for (const box of await page.getByRole("checkbox").all()) await box.check();
  await page.getByRole("button", { name: "I agree and take part" }).tap();
  await page.getByRole("button", { name: "Check my device" }).tap();
  const help = page.getByTestId("permission-help");
  await expect(help).toBeVisible();
  await expect(help).toContainText("set “Motion sensors” to Allow");
  await page.screenshot({ path: "test-results/phone-denied.png" });
  await setSensors("granted");
  await page.getByRole("button", { name: /Check (my device|again)/ }).tap();
  await expect(page.getByRole("button", { name: "Measure" })).toBeVisible({ timeout: 15_000 });
  await world.stop();
  await context.close();
});

test("touch on a phone held sideways: no device sentence, no card; targets that do not fit ask to turn the device and run once it is turned", async ({ page }) => {
  test.setTimeout(90_000);
  await page.setViewportSize({ width: 915, height: 412 });
  const design = techniqueDesign("touch", "cursor", { selection: "tap" });
  design.task = { ...design.task!, amplitudes: [300], widths: [40] };
  const p = await oneParticipant(db, "Phone sideways", design);
  await page.goto(`/s/${p.token}`);
  await expect(page.getByText("You will aim with your finger on the screen.")).toBeVisible();
  await expect(page.getByText("turning your device")).toHaveCount(0);
  await page.getByRole("button", { name: "Continue" }).tap();
  for (const box of await page.getByRole("checkbox").all()) await box.check();
  await page.getByRole("button", { name: "I agree and take part" }).tap();
  await page.getByRole("button", { name: "Check my device" }).tap();
  // unit px: no calibration step at all (no card, no rest measurement)
  await expect(page.getByRole("heading", { name: "How the task works" })).toBeVisible({ timeout: 15_000 });
  await page.getByRole("button", { name: "Start", exact: true }).tap();
  // a 340 px ring (A 300 + W 40) in a task area under 340 px high: turn the device, instead of drawing off-screen
  const warning = page.getByTestId("fit-warning");
  await expect(warning).toContainText("Please turn your device");
  await expect(page.getByTestId("task-canvas")).toHaveCount(0);
  await page.screenshot({ path: "test-results/phone-turn.png" });
  await page.setViewportSize({ width: 412, height: 915 });
  await expect(page.getByTestId("task-canvas")).toBeVisible();
  await expect(warning).toHaveCount(0);
});

test("visual degrees on a phone: the card step, then the blind spot: the dot moves away from the square to the open eye's side and a tap stops it", async ({ page }) => {
  test.setTimeout(90_000);
  const design = techniqueDesign("touch", "cursor", { selection: "tap" });
  design.task = { ...design.task!, unit: "deg-visual", amplitudes: [8], widths: [2] };
  const p = await oneParticipant(db, "Phone blind spot", design);
  await page.goto(`/s/${p.token}`);
  await page.getByRole("button", { name: "Continue" }).tap();
  for (const box of await page.getByRole("checkbox").all()) await box.check();
  await page.getByRole("button", { name: "I agree and take part" }).tap();
  await page.getByRole("button", { name: "Check my device" }).tap();
  await expect(page.getByRole("heading", { name: "1. Screen size" })).toBeVisible({ timeout: 15_000 });
  await page.getByRole("button", { name: "The picture matches the card" }).tap();
  await expect(page.getByRole("heading", { name: "2. Viewing distance" })).toBeVisible();
  // the left eye's blind spot lies on its temporal side, to the left of where it looks (optometry handbooks, common practice)
  await expect(page.getByText(/Close your right eye and look at the black square with your left eye\. A red dot moves to the left/)).toBeVisible();
  const area = page.getByTestId("blind-spot-area");
  const square = (await area.getByTestId("blind-spot-square").boundingBox())!;
  await page.getByRole("button", { name: "Start", exact: true }).tap();
  const dot = area.getByTestId("blind-spot-dot");
  const x1 = (await dot.boundingBox())!.x;
  await page.waitForTimeout(600);
  const x2 = (await dot.boundingBox())!.x;
  expect(x1).toBeLessThan(square.x);
  expect(x2).toBeLessThan(x1 - 10);
  await area.tap();
  await expect(dot).toHaveCount(0);
  await expect(page.getByText("(1 of 5)")).toBeVisible();
});
