/// <reference types="vite/client" />

interface Window {
  /** Test hook (see test-hook.ts): read-only views of the page's state for the browser tests. */
  __strewn?: import('./test-hook.js').StrewnTestHook;
}
