import { lazy, type ComponentType } from "react";

/**
 * A component whose code loads on its own in the browser (`React.lazy`), with a
 * `preload()` the server's loader awaits first: once the code is there, the component
 * renders in the same pass (a thenable already settled), so the server's HTML carries
 * it in place rather than a fallback with the content streamed after it, and the page
 * is whole without scripts. In the browser it hydrates as soon as its code arrives.
 */
export function lazyInPlace<P extends object>(load: () => Promise<ComponentType<P>>) {
  let ready: ComponentType<P> | undefined;
  const preload = () => load().then((component) => (ready = component));
  const Component = lazy<ComponentType<P>>(() => {
    if (!ready) return preload().then((component) => ({ default: component }));
    const settled = ready;
    // React's lazy reads a thenable's value as soon as `then` calls back: here at once.
    return { then: (resolve: (m: { default: ComponentType<P> }) => void) => resolve({ default: settled }) } as never;
  });
  return { Component, preload };
}
