import { useEffect } from "react";
import { useNavigate } from "react-router-dom";

/** Where each `g <key>` chord goes. */
const CHORDS: Record<string, string> = { p: "/projects", h: "/" };

function isTyping(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  // The code editor (Monaco) takes keys through its own input surface, which is neither an input nor
  // contentEditable in every Chromium version: anything inside it is typing too.
  if (target.closest(".monaco-editor")) return true;
  return target.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(target.tagName);
}

/** `/` focuses the page's search field; `g p` opens projects, `g h` home. Ignored while typing or in a dialog. */
export function useGlobalShortcuts(): void {
  const navigate = useNavigate();
  useEffect(() => {
    let chordUntil = 0;
    const onKey = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey || isTyping(e.target) || document.querySelector("dialog[open]"))
        return;
      if (e.key === "/") {
        const search = document.querySelector<HTMLInputElement>("[data-page-search]");
        if (search) {
          e.preventDefault();
          search.focus();
          search.select();
        }
        return;
      }
      if (e.key === "g") {
        chordUntil = Date.now() + 1000;
        return;
      }
      const dest = CHORDS[e.key];
      if (dest && Date.now() < chordUntil) {
        e.preventDefault();
        navigate(dest);
      }
      chordUntil = 0;
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [navigate]);
}
