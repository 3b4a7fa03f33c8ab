// The entrant pays the entry fee by card on the payment service's page and comes back to
// see it paid; the organiser sees the payment in the payments table and refunds it from the
// entry's payment page with a reason; the organiser records a cash payment from the entry page.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { GOOD_PASSWORD } from '../support/api'
import { gotoApp, launchBrowser, openPage, screenshot, signInThroughForm, type Browser } from '../support/browser'
import { closeTestDb, testDb } from '../support/db'
import { entryRow, paymentScene, type PaymentScene } from '../support/payments'

const baseUrl = inject('baseUrl')

let browser: Browser
let s: PaymentScene
beforeAll(async () => {
  browser = await launchBrowser()
  s = await paymentScene(baseUrl, { feeMinor: 32050 })
  await testDb()('entries').where({ id: s.entryId }).update({ comp_id: 'KM7', pilot_name: 'Ada Brightwater' })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

async function noSidewaysScroll(page: import('playwright-core').Page) {
  const { scrollWidth, innerWidth } = await page.evaluate(() => ({ scrollWidth: document.documentElement.scrollWidth, innerWidth: window.innerWidth }))
  expect(scrollWidth).toBeLessThanOrEqual(innerWidth)
}

describe('card payment of the entry fee', () => {
  it('the entrant pays on the card page, returns and sees the payment received', async () => {
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/', 'phone')
    try {
      const path = `/competitions/${s.competitionId}/entries/${s.entryId}/payment`
      await signInThroughForm(page, baseUrl, s.entrantUser.email, GOOD_PASSWORD, path)
      await page.getByTestId('amount-due').waitFor()
      expect(await page.getByTestId('amount-due').textContent()).toBe('€320.50')
      await noSidewaysScroll(page)
      await screenshot(page, 'payment-entrant-unpaid-phone')

      // A declined card first: the card page says so and nothing is paid.
      await page.getByTestId('pay-by-card').click()
      await page.waitForURL(url => url.pathname.startsWith('/pay/'))
      await page.getByLabel('Card number').fill('4000 0000 0000 0002')
      await page.getByRole('button', { name: /^Pay/ }).click()
      await page.getByRole('alert').waitFor()
      expect(await page.getByRole('alert').textContent()).toContain('declined')
      await page.evaluate(() => document.fonts.ready.then(() => undefined))
      await screenshot(page, 'payment-card-page-declined-phone')
      expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'unpaid' })

      await page.getByLabel('Card number').fill('4242 4242 4242 4242')
      await page.getByRole('button', { name: /^Pay/ }).click()
      await page.waitForURL(url => url.pathname === path && url.searchParams.get('return') === 'success')
      await page.getByTestId('payment-received').waitFor()
      expect(await page.getByTestId('amount-due').textContent()).toBe('€0.00')
      expect(await page.locator('[data-payment-status="paid"]').count()).toBeGreaterThan(0)
      expect(await page.getByTestId('pay-by-card').count()).toBe(0)
      await noSidewaysScroll(page)
      await screenshot(page, 'payment-entrant-paid-phone')
      await page.setViewportSize({ width: 1920, height: 1080 })
      await screenshot(page, 'payment-entrant-paid-wall')
    }
    finally {
      await page.close()
    }
  })

  it('the organiser sees it in the payments table and refunds the withdrawn entry from its payment page, with a reason', async () => {
    await testDb()('entries').where({ id: s.entryId }).update({ status: 'withdrawn', withdrawn_at: new Date() })
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/', 'wall')
    try {
      const path = `/competitions/${s.competitionId}/payments`
      await signInThroughForm(page, baseUrl, s.organiserEmail, GOOD_PASSWORD, path)
      const row = page.locator('[data-payment-row="KM7"]')
      await row.waitFor().catch(async (e) => {
        await screenshot(page, 'payments-organiser-failure')
        throw new Error(`${e}\n${page.url()}\n${(await page.textContent('body'))?.slice(0, 500)}`)
      })
      expect(await row.textContent()).toContain('Ada Brightwater')
      expect(await row.textContent()).toContain('€320.50')
      expect(await row.textContent()).toContain('Card')
      expect(await page.getByTestId('total-collected').textContent()).toContain('€320.50')
      await screenshot(page, 'payments-organiser-wall')

      await row.getByRole('link', { name: /Refund/ }).click()
      await page.waitForURL(url => url.pathname.endsWith('/payment'))
      await page.getByRole('button', { name: /^Refund…/ }).click()
      const form = page.getByTestId('payment-refund-form')
      expect(await form.getByLabel(/Amount refunded/).inputValue()).toBe('320.50')
      // A refund without a reason is refused beside the field; nothing moves.
      await form.getByRole('button', { name: 'Refund' }).click()
      await page.getByTestId('error-summary').filter({ hasText: 'Give the reason for the refund' }).waitFor()
      await form.getByLabel('Reason').fill('Withdrew before the event.')
      await form.getByRole('button', { name: 'Refund' }).click()
      await page.getByTestId('payment-notice').filter({ hasText: 'Refunded €320.50.' }).waitFor()
      expect(await page.getByTestId('payment-refund').first().textContent()).toContain('Withdrew before the event.')
      expect(await entryRow(s.entryId)).toMatchObject({ payment_status: 'refunded', paid_minor: 0 })
      await screenshot(page, 'payments-organiser-refunded-wall')

      await gotoApp(page, baseUrl, path)
      await page.getByTestId('total-refunded').filter({ hasText: '€320.50' }).waitFor()
      await page.setViewportSize({ width: 390, height: 844 })
      await page.locator('[data-payment-card="KM7"]').waitFor()
      await noSidewaysScroll(page)
      await screenshot(page, 'payments-organiser-phone')
    }
    finally {
      await page.close()
    }
  })
})

describe('a payment made another way', () => {
  it('the organiser records a cash payment from the entry page and sees the entry paid', async () => {
    const cash = await paymentScene(baseUrl, { feeMinor: 15000 })
    await testDb()('entries').where({ id: cash.entryId }).update({ comp_id: 'KC2', pilot_name: 'Cora Fieldfare' })
    await browser.context.clearCookies()
    const page = await openPage(browser.context, baseUrl, '/', 'desk')
    try {
      const path = `/competitions/${cash.competitionId}/entries/${cash.entryId}`
      await signInThroughForm(page, baseUrl, cash.organiserEmail, GOOD_PASSWORD, path)
      const status = page.getByTestId('payment-status')
      await status.filter({ hasText: /Entry fee:\s*Not paid yet/ }).waitFor()
      expect(await page.getByTestId('payment-owed').textContent()).toBe('€150.00 to pay')

      await page.getByTestId('record-payment').click()
      const form = page.getByTestId('payment-record-form')
      await form.getByLabel('How was it paid?').selectOption('cash')
      expect(await form.getByLabel(/^Amount/).inputValue()).toBe('150.00')
      await form.getByLabel(/Receipt number/).fill('R-0117')
      await screenshot(page, 'payment-record-cash-desk')
      await form.getByRole('button', { name: 'Record the payment' }).click()

      await page.getByTestId('payment-notice').filter({ hasText: 'Recorded €150.00' }).waitFor()
      await status.filter({ hasText: /Entry fee:\s*Paid/ }).waitFor()
      await page.getByTestId('payment-owed').waitFor({ state: 'detached' })
      expect(await entryRow(cash.entryId)).toMatchObject({ payment_status: 'paid', paid_minor: 15000 })
      const [payment] = await testDb()('payments').where({ entry_id: cash.entryId })
      expect(payment).toMatchObject({ method: 'cash', reference: 'R-0117', amount_minor: 15000 })
      await screenshot(page, 'payment-record-cash-paid-desk')

      // The payment page lists it with its method, reference and who recorded it.
      await gotoApp(page, baseUrl, `${path}/payment`)
      const item = page.locator(`[data-payment-id="${payment.id}"]`)
      await item.waitFor()
      expect(await item.textContent()).toContain('Cash')
      expect(await item.textContent()).toContain('reference R-0117')
      expect(await item.textContent()).toContain('recorded by Office Organiser')
    }
    finally {
      await page.close()
    }
  })
})
