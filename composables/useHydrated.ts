/**
 * False while the server-rendered page waits for its JavaScript, true once
 * the app has taken over (and at once on later in-app navigations).
 *
 * Controls use it to refuse input until they work: text typed before
 * hydration would be wiped when v-model takes over, and a click on a submit
 * button would post the form natively. Buttons are disabled and fields
 * read-only for that moment; browsers (and test drivers) wait for them.
 */
export function useHydrated() {
  const hydrated = ref(import.meta.client && !useNuxtApp().isHydrating)
  onMounted(() => {
    hydrated.value = true
  })
  return hydrated
}
