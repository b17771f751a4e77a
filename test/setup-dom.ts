// jsdom lacks a few browser APIs that Lumino and JupyterLab widgets touch.
// Minimal, behaviour-free stand-ins so real widgets can be constructed.
const g = globalThis as unknown as Record<string, unknown>;

if (!('DragEvent' in g)) {
  class DragEventShim extends MouseEvent {
    readonly dataTransfer: DataTransfer | null = null;
  }
  g.DragEvent = DragEventShim;
}
if (typeof window.matchMedia !== 'function') {
  window.matchMedia = (query: string) =>
    ({
      matches: false,
      media: query,
      onchange: null,
      addListener: () => undefined,
      removeListener: () => undefined,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
      dispatchEvent: () => false
    }) as MediaQueryList;
}
class ObserverShim {
  observe(): void {}
  unobserve(): void {}
  disconnect(): void {}
  takeRecords(): [] {
    return [];
  }
}
for (const name of ['IntersectionObserver', 'ResizeObserver']) {
  if (!(name in g)) {
    g[name] = ObserverShim;
  }
}
if (!Element.prototype.scrollIntoView) {
  Element.prototype.scrollIntoView = function () {};
}
if (!Element.prototype.scrollTo) {
  Element.prototype.scrollTo = function () {};
}
