"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

/** The outcome of the last action, in words: a status when it worked, an alert when it did not. */
export type ActionMessage = { ok: boolean; text: string } | null;

/**
 * Runs one of the page's actions (a JSON call), shows its outcome in words and refreshes the
 * server-rendered page so it shows the new state.
 */
export function useAction(): { msg: ActionMessage; act: (f: () => Promise<unknown>, done: string) => Promise<boolean> } {
  const router = useRouter();
  const [msg, setMsg] = useState<ActionMessage>(null);
  const act = async (f: () => Promise<unknown>, done: string): Promise<boolean> => {
    setMsg(null);
    try {
      await f();
      setMsg({ ok: true, text: done });
      router.refresh();
      return true;
    } catch (e) {
      setMsg({ ok: false, text: e instanceof Error ? e.message : String(e) });
      return false;
    }
  };
  return { msg, act };
}

/** The message of {@link useAction}, as a status or an alert. */
export function ActionMessageView({ msg }: { msg: ActionMessage }) {
  return msg ? <p className={msg.ok ? "notice" : "field-error"} role={msg.ok ? "status" : "alert"}>{msg.text}</p> : null;
}
