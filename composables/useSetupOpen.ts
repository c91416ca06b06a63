// Whether this Densitas still waits for its first workshop. The API answers 404 once setup is
// closed, which here simply means "not open".
export async function useSetupOpen() {
  const { data } = await useFetch('/api/setup')
  return computed(() => data.value?.open === true)
}
