import type { Clients, Entry } from "./types";

/** Finds the ids this area's calls need (runs once, signed in as every role). */
export async function setup(_clients: Clients): Promise<void> {}

export const ENTRIES: Record<string, Entry> = {};
