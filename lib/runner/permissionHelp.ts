/** The browsers whose motion-sensor settings we can describe. */
export type SensorBrowser = "ios-safari" | "ios-other" | "android-chrome" | "samsung-internet" | "android-firefox" | "desktop" | "other";

/**
 * Which browser the participant uses, for the motion-permission help (sensorBrowser).
 *
 * Purpose: a denied permission is allowed again in a different place in each browser; the help
 * names the right one. iOS is recognised by "iPhone"/"iPad" or by a Mac User-Agent with a touch
 * screen (iPadOS asks for the desktop site); every browser on iOS uses Safari's engine and its
 * permission. Source: RFC 9110 User-Agent; browsers' published User-Agent formats (common
 * practice). Cost: O(length).
 * @throws never.
 * @example sensorBrowser("Mozilla/5.0 (iPhone; CPU iPhone OS 17_4 like Mac OS X) … Version/17.4 Mobile/15E148 Safari/604.1", 5) // "ios-safari"
 */
export function sensorBrowser(userAgent: string, maxTouchPoints: number): SensorBrowser {
  const ios = /iPhone|iPad|iPod/.test(userAgent) || (/Macintosh/.test(userAgent) && maxTouchPoints > 1);
  if (ios) return /CriOS|FxiOS|EdgiOS/.test(userAgent) ? "ios-other" : "ios-safari";
  if (/Android/.test(userAgent)) {
    if (/SamsungBrowser/.test(userAgent)) return "samsung-internet";
    if (/Firefox\//.test(userAgent)) return "android-firefox";
    if (/Chrome\//.test(userAgent)) return "android-chrome";
    return "other";
  }
  return /Windows|Macintosh|X11|CrOS/.test(userAgent) ? "desktop" : "other";
}

/**
 * How to allow motion sensors again after a refusal, in plain steps (motionPermissionHelp).
 *
 * Purpose: a participant who tapped "Don't allow" is not stuck: the page says where that
 * browser keeps the setting. The menu paths are from memory of current browser versions (iOS
 * Safari asks once per visit and forgets a refusal when the page is opened again; Chrome and
 * Samsung Internet keep a per-site setting behind the icon beside the address), not from a
 * specification: the W3C Device Orientation and Motion permission model leaves this to browsers.
 * Cost: O(1).
 * @throws never.
 * @example motionPermissionHelp("android-chrome")[0] // "Tap the icon at the left of the address bar (a lock or sliders)."
 */
export function motionPermissionHelp(browser: SensorBrowser): string[] {
  switch (browser) {
    case "ios-safari":
    case "ios-other":
      return [
        "Close this tab, open your study link again and tap “Allow” when you are asked about motion and orientation.",
        "If you are not asked: open Settings → Safari → Advanced → Website Data, remove this site, and open the link again.",
      ];
    case "android-chrome":
      return ["Tap the icon at the left of the address bar (a lock or sliders).", "Choose “Permissions” (or “Site settings”) and set “Motion sensors” to Allow.", "Come back to this page and check again."];
    case "samsung-internet":
      return ["Tap the lock icon in the address bar, then “Permissions”.", "Allow motion sensors for this site, come back and check again."];
    case "android-firefox":
      return ["Firefox gives motion sensors to pages without asking. If none arrive, try this link in Chrome."];
    case "desktop":
      return ["A computer usually has no motion sensors. Open the same link on your phone or tablet."];
    default:
      return ["Open your browser's settings for this site and allow motion sensors, then check again. If it does not help, try another browser."];
  }
}
