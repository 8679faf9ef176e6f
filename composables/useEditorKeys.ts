/** Ctrl/Cmd+Z undoes, Shift+Ctrl/Cmd+Z (or Ctrl+Y) redoes; text fields keep their own undo. */
export function useEditorKeys(undo: () => void, redo: () => void, enabled: () => boolean) {
  function onKey(e: KeyboardEvent) {
    if (!enabled()) return
    const target = e.target as HTMLElement | null
    if (target && (target.tagName === 'INPUT' || target.tagName === 'TEXTAREA' || target.isContentEditable)) return
    const mod = e.ctrlKey || e.metaKey
    if (!mod) return
    const k = e.key.toLowerCase()
    if (k === 'z' && !e.shiftKey) { e.preventDefault(); undo() }
    else if ((k === 'z' && e.shiftKey) || k === 'y') { e.preventDefault(); redo() }
  }
  onMounted(() => window.addEventListener('keydown', onKey))
  onBeforeUnmount(() => window.removeEventListener('keydown', onKey))
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
