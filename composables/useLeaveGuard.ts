// Asks before unsaved edits are thrown away: on leaving the page in the app (another page, or another
// tab of the site page, which changes the address's query) and on closing or reloading the browser tab.
// Each editor with a draft calls it with its `dirty` flag; a save that clears the flag lets the user go.
import { onBeforeUnmount, onMounted, type Ref } from 'vue'
import { onBeforeRouteLeave, onBeforeRouteUpdate } from 'vue-router'
import { LEAVE_QUESTION } from '~/utils/formState'

export function useLeaveGuard(dirty: Readonly<Ref<boolean>>, question: string = LEAVE_QUESTION): void {
  const ask = () => !dirty.value || window.confirm(question)
  onBeforeRouteLeave(() => ask())
  onBeforeRouteUpdate(() => ask())
  // The browser shows its own words for this one; returnValue must be set for older engines.
  const onUnload = (e: BeforeUnloadEvent) => {
    if (!dirty.value) return
    e.preventDefault()
    e.returnValue = ''
  }
  onMounted(() => window.addEventListener('beforeunload', onUnload))
  onBeforeUnmount(() => window.removeEventListener('beforeunload', onUnload))
}
