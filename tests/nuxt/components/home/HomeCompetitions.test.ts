import { describe, expect, it } from 'vitest'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import HomeCompetitions from '~/components/home/HomeCompetitions.vue'

const user = { id: 'u1', email: 'pilot@example.org', name: 'Rosa Pilot', isAdmin: false, emailVerified: true }

// The component reads the app's own Pinia, so each test sets the session it needs.
describe('HomeCompetitions', () => {
  it('lists each competition with its airfield, dates, role words and where to go next', async () => {
    const session = useSessionStore()
    session.user = user
    session.memberships = [{
      competitionId: 'c1',
      slug: 'test-cup',
      name: 'Test Cup',
      airfieldName: 'Nowhere Field',
      firstContestDay: '2027-07-10',
      lastContestDay: '2027-07-17',
      roles: ['entrant', 'director'],
    }]
    const home = await mountSuspended(HomeCompetitions)
    const card = home.get('[data-testid="membership-card"]')
    expect(card.text()).toContain('Test Cup')
    expect(card.text()).toContain('Nowhere Field')
    expect(card.text()).toContain('10–17 July 2027')
    expect(card.findAll('[data-testid="role-chip"]').map(c => c.text())).toEqual(['Contest director', 'Entrant'])
    expect(card.find('a[href="/competitions/c1/board"]').text()).toContain('Open the readiness board')
    expect(home.find('[data-testid="admin-note"]').exists()).toBe(false)
  })

  it('offers someone in no competition yet the open ones, each with a way to enter a glider', async () => {
    registerEndpoint('/api/competitions/open', () => ({
      competitions: [{
        competitionId: 'c5', name: 'Spring Open', airfieldName: 'Hill Field', firstContestDay: '2027-05-01',
        lastContestDay: '2027-05-08', registrationClosesOn: null, classes: [{ id: 'k1', name: 'Club' }], myEntries: 0,
      }],
    }))
    const session = useSessionStore()
    session.user = user
    session.memberships = []
    const home = await mountSuspended(HomeCompetitions)
    expect(home.get('[data-testid="no-competitions"]').text()).toContain('You take part in no competition yet')
    const open = home.get('[data-testid="home-open-competition"]')
    expect(open.text()).toContain('Spring Open')
    expect(open.get('a[href="/competitions/c5/entries/new"]').text()).toContain('Enter a glider')
  })

  it('shows site admins the administration note and every competition, not only their memberships', async () => {
    registerEndpoint('/api/competitions', () => ({
      competitions: [{
        competitionId: 'c9', slug: 'other-open', name: 'Other Open', airfieldName: 'Far Field',
        firstContestDay: null, lastContestDay: null, roles: ['organiser'],
      }],
    }))
    const session = useSessionStore()
    session.user = { ...user, isAdmin: true }
    session.memberships = []
    const home = await mountSuspended(HomeCompetitions)
    expect(home.get('[data-testid="admin-note"]').text()).toContain('Site administration')
    const card = home.get('[data-testid="membership-card"]')
    expect(card.text()).toContain('Other Open')
    expect(card.findAll('[data-testid="role-chip"]').map(c => c.text())).toEqual(['Organiser'])
    expect(card.find('a[href="/competitions/c9/entries"]').text()).toContain('Open the competition office')
  })
})
