import { requestMotionPermission } from "@/lib/motion/sources/deviceMotion";

/**
 * Ask for the motion sensors. Call it first thing in a click or tap handler: iOS Safari shows
 * its prompt only from a user gesture (W3C Device Orientation and Motion, permission model).
 * Chromium grants the sensors without a prompt unless the site's setting blocks them, which the
 * Permissions API reports as "denied" for "gyroscope".
 */
export async function askMotionPermission(): Promise<"granted" | "denied" | "unavailable"> {
  const answer = await requestMotionPermission();
  if (answer !== "granted") return answer;
  try {
    const state = await navigator.permissions.query({ name: "gyroscope" as PermissionName });
    if (state.state === "denied") return "denied";
  } catch {
    /* no Permissions API entry for sensors (Safari, Firefox): nothing more to learn */
  }
  return "granted";
}
