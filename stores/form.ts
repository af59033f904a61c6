interface ApiErrorBody { statusMessage?: string, message?: string, data?: { fields?: Record<string, string>, reason?: string } }

/**
 * Submit state for a form: `pending`, the server's message and its per-field errors
 * (the `data.fields` of a 400 from server/utils/validate.ts).
 */
export function useFormSubmit() {
  const pending = ref(false)
  const message = ref('')
  const reason = ref('')
  const fields = ref<Record<string, string>>({})

  async function submit<T>(action: () => Promise<T>): Promise<T | undefined> {
    pending.value = true
    message.value = ''
    reason.value = ''
    fields.value = {}
    try {
      return await action()
    } catch (err) {
      const body = (err as { data?: ApiErrorBody }).data
      message.value = body?.statusMessage ?? body?.message ?? 'Something went wrong; try again'
      fields.value = body?.data?.fields ?? {}
      reason.value = body?.data?.reason ?? ''
      return undefined
    } finally {
      pending.value = false
    }
  }

  return { pending, message, reason, fields, submit }
}
