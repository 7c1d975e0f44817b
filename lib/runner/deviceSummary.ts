/** Coarse device details stored with a consent record: nothing that identifies the person. */
export interface DeviceSummary {
  deviceClass: "phone-or-tablet" | "desktop" | "unknown";
  browserFamily: "chromium" | "firefox" | "safari" | "other";
  /** Operating system family (coarse; iPadOS that reports itself as macOS counts as macOS). */
  osFamily?: "android" | "ios" | "windows" | "macos" | "chromeos" | "linux" | "other";
  screenBand: "small" | "medium" | "large" | "unknown";
}

/**
 * Coarse device summary (deviceSummary).
 *
 * Purpose: what the consent register keeps about the device: its class and browser family from
 * the User-Agent, the screen's shorter side in three bands; never the full User-Agent, the
 * exact screen size or anything else that narrows down a person. Source: RFC 9110 User-Agent;
 * common practice of data minimisation. Cost: O(length).
 * @throws never.
 * @example deviceSummary("Mozilla/5.0 (Linux; Android 14; Pixel 7) … Chrome/126 Mobile Safari/537.36", 412).deviceClass // "phone-or-tablet"
 */
export function deviceSummary(userAgent: string | null, screenShortSidePx: number | null): DeviceSummary {
  const ua = userAgent ?? "";
  const deviceClass = ua === "" ? "unknown" : /Mobi|Android|iPhone|iPad|Tablet/i.test(ua) ? "phone-or-tablet" : "desktop";
  const browserFamily = /Firefox\//.test(ua) ? "firefox" : /Chrome\/|Chromium\/|Edg\//.test(ua) ? "chromium" : /Safari\//.test(ua) ? "safari" : "other";
  const s = screenShortSidePx;
  const screenBand = s === null || !(s > 0) ? "unknown" : s < 600 ? "small" : s < 1000 ? "medium" : "large";
  const osFamily = /Android/.test(ua) ? "android" : /iPhone|iPad|iPod/.test(ua) ? "ios" : /Windows NT/.test(ua) ? "windows" : /CrOS/.test(ua) ? "chromeos" : /Mac OS X|Macintosh/.test(ua) ? "macos" : /Linux|X11/.test(ua) ? "linux" : "other";
  return { deviceClass, browserFamily, osFamily, screenBand };
}
