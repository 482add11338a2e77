/**
 * Monaco from the app's own bundle, never a CDN (STACK.md "Monaco offline"). Import this only from the
 * lazily loaded template editor: it pulls in a 4 MB chunk.
 */
import * as monaco from "monaco-editor";
import { loader } from "@monaco-editor/react";
// monaco-editor 0.57's exports map resolves "monaco-editor/<path>" to esm/vs/<path>.js (STACK.md).
import EditorWorker from "monaco-editor/editor/editor.worker?worker";

// The template editor uses Liquid and plain text, which need only the base editor worker; the
// language-service workers (JSON, TypeScript) are left out so the build does not ship them for nothing.
self.MonacoEnvironment = {
  getWorker() {
    return new EditorWorker();
  },
};
loader.config({ monaco });

export { monaco };
