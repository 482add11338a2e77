import { createContext, useCallback, useContext, useMemo, useState, type ReactNode } from "react";
import { cn } from "@/lib/cn";

type Tone = "pass" | "fail" | "warn" | "neutral";
interface ToastItem {
  id: number;
  message: string;
  tone: Tone;
}

const ToastContext = createContext<(message: string, tone?: Tone) => void>(() => {});

/** Holds the toasts and renders them in a polite live region, bottom right. */
export function ToastProvider({ children }: { children: ReactNode }) {
  const [items, setItems] = useState<ToastItem[]>([]);
  const push = useCallback((message: string, tone: Tone = "neutral") => {
    const id = Date.now() + Math.random();
    setItems((xs) => [...xs, { id, message, tone }]);
    window.setTimeout(() => setItems((xs) => xs.filter((x) => x.id !== id)), 5000);
  }, []);
  const value = useMemo(() => push, [push]);
  return (
    <ToastContext.Provider value={value}>
      {children}
      <div aria-live="polite" className="pointer-events-none fixed right-4 bottom-4 z-50 flex flex-col gap-2">
        {items.map((t) => (
          <div
            key={t.id}
            role="status"
            className={cn(
              "pointer-events-auto rounded border px-3 py-2 text-sm shadow-md",
              t.tone === "pass" && "border-pass-300 bg-pass-50 text-pass-800",
              t.tone === "fail" && "border-fail-300 bg-fail-50 text-fail-800",
              t.tone === "warn" && "border-warn-300 bg-warn-50 text-warn-800",
              t.tone === "neutral" && "border-ink-700 bg-ink-900 text-ink-50",
            )}
          >
            {t.message}
          </div>
        ))}
      </div>
    </ToastContext.Provider>
  );
}

/** Shows a short message that fades after five seconds. */
export function useToast() {
  return useContext(ToastContext);
}
