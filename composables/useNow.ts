// The browser's clock as a ref, ticking every second after mount (null during SSR, so server and
// client render the same markup and countdowns start on the client).
export function useNow(intervalMs = 1000) {
  const now = ref<number | null>(null)
  let timer: ReturnType<typeof setInterval> | undefined
  onMounted(() => {
    now.value = Date.now()
    timer = setInterval(() => { now.value = Date.now() }, intervalMs)
  })
  onBeforeUnmount(() => clearInterval(timer))
  return now
}
