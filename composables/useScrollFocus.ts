/**
 * Keyboard access to a box that scrolls: while its content overflows, the box joins the Tab
 * order (tabindex 0) as a named group (not a region: that landmark is kept for page sections),
 * so someone without a mouse can focus it and scroll with the arrow keys (WCAG 2.1.1). When
 * everything fits, it stays out of the way.
 *
 *   const box = ref<HTMLElement | null>(null)
 *   const scrollFocus = useScrollFocus(box, 'Census table')
 *   <div ref="box" class="overflow-x-auto" v-bind="scrollFocus">
 */
export function useScrollFocus(box: Ref<HTMLElement | null>, label: MaybeRefOrGetter<string>) {
  const overflowing = ref(false)
  let observer: ResizeObserver | null = null

  function measure(): void {
    const element = box.value
    overflowing.value = Boolean(element && (element.scrollWidth > element.clientWidth + 1 || element.scrollHeight > element.clientHeight + 1))
  }

  onMounted(() => {
    if (!box.value) return
    observer = new ResizeObserver(measure)
    observer.observe(box.value)
    for (const child of Array.from(box.value.children)) observer.observe(child)
    measure()
  })
  onUpdated(measure)
  onBeforeUnmount(() => observer?.disconnect())

  return computed(() => (overflowing.value
    ? { 'tabindex': 0, 'role': 'group', 'aria-label': toValue(label) }
    : {}))
}
