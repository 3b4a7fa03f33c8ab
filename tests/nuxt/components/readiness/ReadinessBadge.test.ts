import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import ReadinessBadge from '~/components/readiness/ReadinessBadge.vue'
import { READINESS_STATES } from '~/utils/readiness'

describe('ReadinessBadge', () => {
  it.each([
    ['ready', 'Ready'],
    ['caution', 'Caution'],
    ['held', 'Held'],
    ['unchecked', 'Unchecked'],
  ] as const)('shows %s with the word "%s" and its own shape', async (state, word) => {
    const badge = await mountSuspended(ReadinessBadge, { props: { state } })
    expect(badge.text()).toBe(word)
    expect(badge.attributes('data-readiness')).toBe(state)
    const svg = badge.get('svg')
    expect(svg.attributes('aria-hidden')).toBe('true')
    expect(svg.attributes('data-shape')).toBe(state)
  })

  it('draws a different icon for every state, so colour is never the only cue', async () => {
    const drawings = new Set<string>()
    for (const state of READINESS_STATES) {
      const badge = await mountSuspended(ReadinessBadge, { props: { state } })
      drawings.add(badge.get('svg').html().replace(/\s+/g, ' '))
    }
    expect(drawings.size).toBe(READINESS_STATES.length)
  })
})
