// Puts the sunlight class on <html> during server rendering and keeps it in step afterwards.
// A plugin rather than app.vue, so error.vue (which replaces app.vue) gets the theme too.
export default defineNuxtPlugin(() => {
  const preferences = usePreferencesStore()
  useHead({
    htmlAttrs: {
      class: computed(() => (preferences.sunlight ? 'sunlight' : '')),
    },
  })
})
