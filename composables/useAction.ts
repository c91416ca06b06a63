// One way to run a form's request: a busy flag for the button, and the server's message on failure.
export function useAction<A extends unknown[], R>(run: (...args: A) => Promise<R>) {
  const busy = ref(false)
  const error = ref('')

  async function execute(...args: A): Promise<R | undefined> {
    busy.value = true
    error.value = ''
    try {
      return await run(...args)
    }
    catch (e) {
      error.value = apiErrorMessage(e)
      return undefined
    }
    finally {
      busy.value = false
    }
  }

  return { busy, error, execute }
}
