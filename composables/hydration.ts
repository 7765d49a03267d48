/** True while the browser takes over a page the server already rendered, and already guarded. */
export function isHydratingServerPage(): boolean {
  const nuxtApp = useNuxtApp()
  return import.meta.client && nuxtApp.isHydrating === true && nuxtApp.payload.serverRendered === true
}
