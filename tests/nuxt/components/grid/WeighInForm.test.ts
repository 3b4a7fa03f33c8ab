// The weigh-in on the grid: what is typed gives the mass and CG the engine gives, lb and inches
// convert, and a mass over the class limit shows its finding, linked to its rule, before the
// check is submitted.
// Mass × arm method: total mass ΣW, CG arm Σ(W·arm)/ΣW from the datum (FAA-H-8083-1, Aircraft
// Weight and Balance Handbook, ch. 2; the same method as shared/engine/weigh-in.ts).
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import WeighInForm from '~/components/grid/WeighInForm.vue'
import { competition, dossier, fieldOf } from '../../../unit/shared/engine/builders'

const DAY = '2027-07-13'

async function mountForm(entry: Parameters<typeof dossier>[1] = {}) {
  const d = dossier({}, entry)
  const updates: unknown[] = []
  const form = await mountSuspended(WeighInForm, {
    props: { 'dossier': d, 'competition': competition(), 'field': fieldOf(d), 'day': DAY, 'competitionId': 'comp-1', 'onUpdate:modelValue': (v: unknown) => updates.push(v) },
  })
  return { form, updates }
}

async function type(form: Awaited<ReturnType<typeof mountForm>>['form'], readings: [string, string][]) {
  for (const [i, [w, a]] of readings.entries()) {
    await form.get(`[data-testid="weigh-weight-${i}"]`).setValue(w)
    await form.get(`[data-testid="weigh-arm-${i}"]`).setValue(a)
  }
}

describe('WeighInForm', () => {
  it('gives the mass as ΣW and the CG as Σ(W·arm)/ΣW from kg and metre readings', async () => {
    const { form, updates } = await mountForm()
    // Worked example in the handbook's manner: main wheel 310 kg at 0.12 m, tail wheel 25 kg at 4.50 m.
    // ΣW = 335 kg; Σ(W·arm) = 37.2 + 112.5 = 149.7 kg·m; CG = 149.7 / 335 = 0.44687 m.
    await type(form, [['310', '0.12'], ['25', '4,50']])
    expect(form.get('[data-testid="weigh-mass"]').text()).toBe('335.0 kg')
    expect(form.get('[data-testid="weigh-cg"]').text()).toBe('0.447 m')
    expect(updates.at(-1)).toEqual({ units: 'kg-m', readings: [{ point: 'main-wheel', weight: 310, arm: 0.12 }, { point: 'tail-wheel', weight: 25, arm: 4.5 }] })
    // No pilot's mass recorded: the sum counts the glider only, and says so.
    expect(form.get('[data-testid="weigh-pilot-missing"]').text()).toContain('counts the glider only')
    expect(form.findAll('[data-testid="weigh-finding"]').map(f => [f.attributes('data-check-id'), f.text().includes('Advisory')])).toEqual([['mass.class-limit', true]])
    expect(form.get('[data-testid="weigh-caution"]').text()).toContain('Local procedures and the competition’s rules prevail')
    form.unmount()
  })

  it('converts lb and inch readings (1 lb = 0.45359237 kg, 1 in = 0.0254 m, exact by definition)', async () => {
    const { form, updates } = await mountForm()
    await form.get('[data-testid="weigh-units-lb-in"]').trigger('click')
    // 100 lb at 10 in and 50 lb at 100 in: ΣW = 150 lb = 68.0 kg; CG = 6000 / 150 = 40 in = 1.016 m.
    await type(form, [['100', '10'], ['50', '100']])
    expect(form.get('[data-testid="weigh-mass"]').text()).toBe('68.0 kg')
    expect(form.get('[data-testid="weigh-cg"]').text()).toBe('1.016 m')
    expect(form.get('[data-testid="weigh-result"]').text()).toContain('40.00 in')
    expect((updates.at(-1) as { units: string }).units).toBe('lb-in')
    form.unmount()
  })

  it('shows the class-limit finding for a mass over the class’s maximum take-off mass', async () => {
    // Standard class limited to 525 kg here (FAI Sporting Code Section 3 Annex A, from memory); the flight manual allows 600.
    const { form } = await mountForm({ mtomKg: 600 })
    await type(form, [['500', '0.10'], ['40', '4.40']])
    expect(form.get('[data-testid="weigh-mass"]').text()).toBe('540.0 kg')
    const ids = form.findAll('[data-testid="weigh-finding"]').map(f => f.attributes('data-check-id'))
    expect(ids).toEqual(['mass.class-limit'])
    expect(form.get('[data-testid="weigh-findings"]').text()).toContain('allows at most 525.0 kg')
    const rule = form.get('[data-testid="weigh-finding"] [data-testid="finding-rule-link"]')
    expect(rule.attributes('href')).toBe('/competitions/comp-1/checks#mass.class-limit')
    expect(rule.text()).toBe('Rule: mass.class-limit')
    form.unmount()
  })

  it('shows the CG finding when the computed CG is behind the aft limit, and emits nothing for a half-typed reading', async () => {
    const { form, updates } = await mountForm({ cgForwardLimitM: 0.2, cgAftLimitM: 0.4 })
    await type(form, [['310', '0.12'], ['25', '']])
    expect(form.find('[data-testid="weigh-result"]').exists()).toBe(false)
    expect(form.get('[data-testid="weigh-problem"]').text()).toContain('lever arm')
    expect(updates.at(-1)).toBeNull()
    await form.get('[data-testid="weigh-arm-1"]').setValue('4.50')
    expect(form.findAll('[data-testid="weigh-finding"]').map(f => f.attributes('data-check-id'))).toEqual(['mass.class-limit', 'cg.within-limits'])
    form.unmount()
  })

  it('adds the declared water ballast and the pilot as terms of the take-off mass, and their moments to the CG', async () => {
    // Glider 335 kg at 0.44687 m (149.7 kg·m); pilot 85 kg at −1.2 m (−102 kg·m); 40 kg of water
    // ballast declared, weighed dry, at 0.3 m (12 kg·m): 460 kg, CG 59.7 / 460 = 0.130 m.
    const { form, updates } = await mountForm({ pilotMassKg: 85, pilotArmM: -1.2, ballastArmM: 0.3 })
    await type(form, [['310', '0.12'], ['25', '4.50']])
    await form.get('[data-testid="weigh-ballast-dry"]').trigger('click')
    await form.get('[data-testid="weigh-ballast-kg"]').setValue('40')
    expect(form.findAll('[data-testid="weigh-term"]').map(t => t.attributes('data-term'))).toEqual(['glider', 'ballast', 'pilot'])
    expect(form.get('[data-testid="weigh-mass"]').text()).toBe('460.0 kg')
    expect(form.get('[data-testid="weigh-cg"]').text()).toBe('0.130 m')
    expect(form.find('[data-testid="weigh-pilot-missing"]').exists()).toBe(false)
    expect(form.find('[data-testid="weigh-no-findings"]').exists()).toBe(true)
    expect((updates.at(-1) as { declaredBallastKg: number }).declaredBallastKg).toBe(40)
    form.unmount()
  })
})
