/**
 * A form's busy flag, its error message and the server's field messages
 * around one async submit, cleared in `finally` whatever happens.
 */
export function useFormSubmit() {
  const busy = ref(false)
  const message = ref('')
  const fields = ref<Record<string, string>>({})

  async function run(action: () => Promise<void>): Promise<void> {
    busy.value = true
    message.value = ''
    fields.value = {}
    try {
      await action()
    }
    catch (err: unknown) {
      const e = errorInfo(err)
      message.value = e.message
      fields.value = e.fields
    }
    finally {
      busy.value = false
    }
  }

  return { busy, message, fields, run }
}
