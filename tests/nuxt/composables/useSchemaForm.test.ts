// The submit cycle of every form: zod's errors beside their fields (flattened as zod itself
// flattens them), and a schema that may be fetched on the first submit instead of with the page.
import { describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { defineComponent, h } from 'vue'
import { z } from 'zod'

const schema = z.object({
  name: z.string().min(1, { error: 'Enter a name.' }),
  span: z.number({ error: 'Enter the span in metres.' }).max(30, { error: 'At most 30 m.' }),
}).refine(v => v.name !== 'nobody', { error: 'Not a glider.' })

async function mountForm(schemaOption: unknown, action = vi.fn(async () => {})) {
  let form!: ReturnType<typeof useSchemaForm<typeof schema, 'name' | 'span'>>
  const Form = defineComponent({
    setup() {
      form = useSchemaForm({ schema: schemaOption as typeof schema, fields: ['name', 'span'] as const, idPrefix: 't', action })
      return () => h('div')
    },
  })
  await mountSuspended(Form)
  return { form, action }
}

describe('useSchemaForm', () => {
  it('puts each issue beside its field, and a whole-form issue in the summary, as z.flattenError does', async () => {
    const { form, action } = await mountForm(schema)
    await form.submit({ name: '', span: 31 })
    const flat = z.flattenError(schema.safeParse({ name: '', span: 31 }).error!)
    expect(form.errorOf('name')).toBe(flat.fieldErrors.name![0])
    expect(form.errorOf('span')).toBe('At most 30 m.')
    await form.submit({ name: 'nobody', span: 15 })
    expect(form.summary.value.map(i => i.message)).toEqual(['Not a glider.'])
    expect(action).not.toHaveBeenCalled()
  })

  it('fetches a schema given as a loader once, on the first submit, and sends what it parsed', async () => {
    const loader = vi.fn(async () => schema)
    const { form, action } = await mountForm(loader)
    expect(loader).not.toHaveBeenCalled()
    await form.submit({ name: '', span: 15 })
    expect(form.errorOf('name')).toBe('Enter a name.')
    await form.submit({ name: 'Kestrel', span: 15 })
    expect(action).toHaveBeenCalledWith({ name: 'Kestrel', span: 15 })
    expect(loader).toHaveBeenCalledTimes(1)
  })

  it('says the page could not reach its server when the schema cannot be fetched, and sends nothing', async () => {
    const { form, action } = await mountForm(async () => { throw new TypeError('Failed to fetch dynamically imported module') })
    await form.submit({ name: 'Kestrel', span: 15 })
    expect(form.summary.value.map(i => i.message).join(' ')).toMatch(/reach|connection|signal/i)
    expect(action).not.toHaveBeenCalled()
  })
})
