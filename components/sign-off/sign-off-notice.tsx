"use client";

import { createContext, useContext, useState, type ReactNode } from "react";

type Notice = { text: string; tone: "ok" | "error" } | null;
const NoticeContext = createContext<((n: Notice) => void) | null>(null);

/**
 * Holds the outcome of the last sign-off step above the queue. A step moves its row to another group,
 * which re-mounts the row's buttons, so the message lives here, where a refresh of the page keeps it.
 */
export function SignOffNoticeProvider({ children }: { children: ReactNode }) {
  const [notice, setNotice] = useState<Notice>(null);
  return (
    <NoticeContext.Provider value={setNotice}>
      <div
        role="status"
        aria-live="polite"
        className={notice ? `sheet font-semibold ${notice.tone === "ok" ? "text-ok" : "text-warn"}` : "sr-only"}
      >
        {notice?.text}
      </div>
      {children}
    </NoticeContext.Provider>
  );
}

/** The page's notice setter, or null outside a provider (the caller then shows the message itself). */
export function useSignOffNotice() {
  return useContext(NoticeContext);
}
