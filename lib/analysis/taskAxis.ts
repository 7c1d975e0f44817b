import type { Point } from "../task/point";

/** Where points lie: in a plane (px, mm, visual degrees) or on the view sphere (yaw, pitch in degrees). */
export type Geometry = "plane" | "sphere";

/**
 * The task axis of one movement, from its start S towards its target T, in the table's unit.
 * `along(P)` is the distance of P along the axis from S (the target lies at `length`), `across(P)`
 * its signed distance from the axis (+ to the side of +y when the axis runs along +x), `from(P, Q)`
 * the distance between two points.
 */
export interface TaskAxis {
  readonly length: number;
  along(p: Point): number;
  across(p: Point): number;
  between(p: Point, q: Point): number;
}

const RAD = Math.PI / 180;

/** Unit view direction of (yaw ψ, pitch θ) in degrees: (cos θ sin ψ, sin θ, cos θ cos ψ); x right, y up, z forward. */
function direction(p: Point): [number, number, number] {
  const yaw = p.x * RAD;
  const pitch = p.y * RAD;
  const c = Math.cos(pitch);
  return [c * Math.sin(yaw), Math.sin(pitch), c * Math.cos(yaw)];
}

/** Angle between two unit vectors (radians), atan2(|u × v|, u·v): accurate for small and large angles. */
function angle(u: readonly number[], v: readonly number[]): number {
  const cx = u[1]! * v[2]! - u[2]! * v[1]!;
  const cy = u[2]! * v[0]! - u[0]! * v[2]!;
  const cz = u[0]! * v[1]! - u[1]! * v[0]!;
  return Math.atan2(Math.hypot(cx, cy, cz), u[0]! * v[0]! + u[1]! * v[1]! + u[2]! * v[2]!);
}

/**
 * Great-circle angle between two view directions given as (yaw, pitch) in degrees
 * (viewAngleBetween): atan2(|u × v|, u·v) of their unit vectors (spherical geometry).
 * Cost: O(1).
 * @throws never.
 * @example viewAngleBetween({ x: 0, y: 60 }, { x: 20, y: 60 }) // 9.9618…
 */
export function viewAngleBetween(a: Point, b: Point): number {
  return angle(direction(a), direction(b)) / RAD;
}

/**
 * The task axis from S to T (taskAxis).
 *
 * Plane (ISO 9241-411:2012; MacKenzie 1992): u = (T − S)/|T − S|, along = (P − S)·u,
 * across = (P − S) × u (z component, sign as in a right-handed x, y), distances Euclidean.
 * Sphere (view mode; science.md §1 "View mode", spherical geometry, the convention is ours):
 * points are view directions d = (cos θ sin ψ, sin θ, cos θ cos ψ); the axis is the great circle
 * through S and T with pole n = S × T/|S × T| and e₂ = n × S; along = atan2(P·e₂, P·S), the angle
 * from S to P's projection onto that circle (T at the great-circle distance a = angle(S, T));
 * across = asin(P·n), P's angle from the circle; distances are great-circle angles. All in degrees.
 * Treating (ψ, θ) as Cartesian instead would be off by about 1/cos θ away from the horizon.
 *
 * Cost: O(1).
 * @throws Error when S and T coincide (no axis) or, on the sphere, are opposite (no single great circle).
 * @example taskAxis("sphere", { x: 0, y: 60 }, { x: 20, y: 60 }).length // 9.9618… (20° of yaw at 60° pitch)
 */
export function taskAxis(geometry: Geometry, s: Point, t: Point): TaskAxis {
  if (geometry === "plane") {
    const ax = t.x - s.x;
    const ay = t.y - s.y;
    const length = Math.hypot(ax, ay);
    if (!(length > 0)) throw new Error("taskAxis requires a start apart from the target centre");
    const ux = ax / length;
    const uy = ay / length;
    return {
      length,
      along: (p) => (p.x - s.x) * ux + (p.y - s.y) * uy,
      across: (p) => -(p.x - s.x) * uy + (p.y - s.y) * ux,
      between: (p, q) => Math.hypot(p.x - q.x, p.y - q.y),
    };
  }
  const ds = direction(s);
  const dt = direction(t);
  let nx = ds[1] * dt[2] - ds[2] * dt[1];
  let ny = ds[2] * dt[0] - ds[0] * dt[2];
  let nz = ds[0] * dt[1] - ds[1] * dt[0];
  const norm = Math.hypot(nx, ny, nz);
  if (!(norm > 1e-12)) throw new Error("taskAxis requires a start apart from the target centre and not opposite it");
  nx /= norm;
  ny /= norm;
  nz /= norm;
  const e2 = [ny * ds[2] - nz * ds[1], nz * ds[0] - nx * ds[2], nx * ds[1] - ny * ds[0]] as const;
  return {
    length: angle(ds, dt) / RAD,
    along: (p) => {
      const d = direction(p);
      return Math.atan2(d[0] * e2[0] + d[1] * e2[1] + d[2] * e2[2], d[0] * ds[0] + d[1] * ds[1] + d[2] * ds[2]) / RAD;
    },
    across: (p) => {
      const d = direction(p);
      return Math.asin(Math.max(-1, Math.min(1, d[0] * nx + d[1] * ny + d[2] * nz))) / RAD;
    },
    between: (p, q) => angle(direction(p), direction(q)) / RAD,
  };
}
