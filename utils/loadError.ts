// A detail page whose record did not load shows the error page with the server's status and words
// (a record the person may not see is a 404), instead of a page drawn without its data.
export function throwOnLoadError(error: MaybeRefOrGetter<{ statusCode?: number } | null | undefined>) {
  const failed = toValue(error)
  if (failed) throw createError({ statusCode: failed.statusCode ?? 404, message: apiErrorMessage(failed), fatal: true })
}
