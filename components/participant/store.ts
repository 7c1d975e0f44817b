import { openDB, type DBSchema, type IDBPDatabase } from "idb";
import type { Progress } from "@/lib/runner/progress";
import type { SequenceBatch } from "@/lib/runner/batch";
import type { RecordedMovement } from "@/lib/runner/sequenceRecorder";

/** A sequence waiting in the browser: pending (to send) or refused by the server (kept, not resent). */
export interface QueuedBatch {
  key: string;
  batch: SequenceBatch;
  state: "pending" | "refused";
  attempts: number;
  refusal?: string;
}

interface SessionDb extends DBSchema {
  progress: { key: string; value: Progress };
  movements: { key: [string, number]; value: { key: string; trial: number; movement: RecordedMovement } };
  batches: { key: string; value: QueuedBatch };
}

/** The participant's local store (IndexedDB): every movement and sequence is here before it is sent. */
export interface SessionStore {
  progress(): Promise<Progress | undefined>;
  saveProgress(p: Progress): Promise<void>;
  saveMovement(key: string, m: RecordedMovement): Promise<void>;
  /** Stores a finished sequence and the progress after it in one transaction; drops its loose movements. */
  finishSequence(batch: SequenceBatch, progress: Progress): Promise<void>;
  batches(): Promise<QueuedBatch[]>;
  update(b: QueuedBatch): Promise<void>;
  remove(key: string): Promise<void>;
  /** Withdrawal: forget everything kept locally. */
  clear(): Promise<void>;
}

export async function openSessionStore(participantId: number): Promise<SessionStore> {
  const db: IDBPDatabase<SessionDb> = await openDB<SessionDb>(`yawpoint-session-${participantId}`, 1, {
    upgrade(d) {
      d.createObjectStore("progress");
      d.createObjectStore("movements", { keyPath: ["key", "trial"] });
      d.createObjectStore("batches", { keyPath: "key" });
    },
  });
  return {
    progress: () => db.get("progress", "p"),
    saveProgress: async (p) => {
      await db.put("progress", p, "p");
    },
    saveMovement: async (key, movement) => {
      await db.put("movements", { key, trial: movement.trial, movement });
    },
    async finishSequence(batch, progress) {
      const tx = db.transaction(["batches", "progress", "movements"], "readwrite");
      await Promise.all([
        tx.objectStore("batches").put({ key: batch.key, batch, state: "pending", attempts: 0 }),
        tx.objectStore("progress").put(progress, "p"),
        tx.objectStore("movements").delete(IDBKeyRange.bound([batch.key, 0], [batch.key, Number.MAX_SAFE_INTEGER])),
        tx.done,
      ]);
    },
    batches: () => db.getAll("batches"),
    update: async (b) => {
      await db.put("batches", b);
    },
    remove: (key) => db.delete("batches", key),
    async clear() {
      const tx = db.transaction(["batches", "progress", "movements"], "readwrite");
      await Promise.all([tx.objectStore("batches").clear(), tx.objectStore("progress").clear(), tx.objectStore("movements").clear(), tx.done]);
    },
  };
}
