// Per-device display preferences. Kept in a cookie (not localStorage) so the server renders the
// chosen theme on the first byte: no flash of the wrong contrast on a phone in the sun.
export const SUNLIGHT_COOKIE = 'gridmark-sunlight'

export const usePreferencesStore = defineStore('preferences', () => {
  const sunlightCookie = useCookie<'on' | 'off'>(SUNLIGHT_COOKIE, {
    default: () => 'off',
    maxAge: 60 * 60 * 24 * 400,
    sameSite: 'lax',
    path: '/',
  })

  const sunlight = computed(() => sunlightCookie.value === 'on')

  function setSunlight(on: boolean) {
    sunlightCookie.value = on ? 'on' : 'off'
  }

  function toggleSunlight() {
    setSunlight(!sunlight.value)
  }

  return { sunlight, setSunlight, toggleSunlight }
})
