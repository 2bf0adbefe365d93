// The renderer tests run in happy-dom and import the window's code and components: the root
// type check (tsconfig.json, Node types) needs the DOM library and a type for .vue files.
/// <reference lib="dom" />
/// <reference lib="dom.iterable" />

declare module '*.vue' {
  import type { DefineComponent } from 'vue'
  const component: DefineComponent<Record<string, unknown>, object, unknown>
  export default component
}
