/**
 * Ctrl/Cmd+Z undoes, Shift+Ctrl/Cmd+Z (or Ctrl+Y) redoes. A text field being
 * typed in keeps its own undo, which only changes its text. A field of the
 * editor's panels (inside `[data-undo-scope]`) with nothing typed since it was
 * focused or entered undoes the design instead: the browser's own undo there
 * would bring back text from before the last edit, which the field would then
 * save as a new edit.
 */
export function useEditorKeys(undo: () => void, redo: () => void, enabled: () => boolean) {
  const typed = new WeakSet<EventTarget>()
  const onInput = (e: Event) => { if (e.target) typed.add(e.target) }
  const onSettled = (e: Event) => { if (e.target) typed.delete(e.target) }
  function onKey(e: KeyboardEvent) {
    if (e.key === 'Enter' && e.target) typed.delete(e.target)
    if (!enabled()) return
    const target = e.target as HTMLElement | null
    if (target && (target.tagName === 'INPUT' || target.tagName === 'TEXTAREA' || target.isContentEditable)) {
      if (target.tagName !== 'INPUT' || typed.has(target) || !target.closest('[data-undo-scope]')) return
    }
    const mod = e.ctrlKey || e.metaKey
    if (!mod) return
    const k = e.key.toLowerCase()
    if (k === 'z' && !e.shiftKey) { e.preventDefault(); undo() }
    else if ((k === 'z' && e.shiftKey) || k === 'y') { e.preventDefault(); redo() }
  }
  onMounted(() => {
    window.addEventListener('keydown', onKey)
    window.addEventListener('input', onInput, true)
    window.addEventListener('focusin', onSettled, true)
  })
  onBeforeUnmount(() => {
    window.removeEventListener('keydown', onKey)
    window.removeEventListener('input', onInput, true)
    window.removeEventListener('focusin', onSettled, true)
  })
}

/** Asks before leaving the page, or closing the tab, with unsaved changes. */
export function useUnsavedGuard(dirty: () => boolean) {
  const warn = (e: BeforeUnloadEvent) => {
    if (dirty()) { e.preventDefault(); e.returnValue = '' }
  }
  onMounted(() => window.addEventListener('beforeunload', warn))
  onBeforeUnmount(() => window.removeEventListener('beforeunload', warn))
  onBeforeRouteLeave(() => {
    if (dirty() && !window.confirm('This design has unsaved changes. Leave without saving?')) return false
  })
}
