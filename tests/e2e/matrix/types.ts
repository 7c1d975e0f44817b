import type { APIRequestContext } from "@playwright/test";
import type { DemoRole } from "../helpers";

export type Clients = Map<DemoRole | "anonymous", APIRequestContext>;

/** One call of a route: who may make it. Paths may be computed after `setup` has found ids. */
export type Call = {
  method: "GET" | "POST" | "PUT" | "PATCH" | "DELETE";
  path: string | (() => Promise<string> | string);
  body?: () => unknown;
  multipart?: () => Record<string, string | { name: string; mimeType: string; buffer: Buffer }>;
  allowed: DemoRole[];
};

/**
 * public: anyone (say why); calls: checked anonymous 401 / wrong role 403 / right role 2xx;
 * token: reached by a participant's session token instead of an account — its own spec file
 * must prove the token reaches only its own session (name that file in `checkedIn`).
 */
export type Entry = { public: true; note: string } | { calls: Call[] } | { token: true; checkedIn: string };
