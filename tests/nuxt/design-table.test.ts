import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import DesignTable from '~/components/shop/DesignTable.vue'
import RevisionList from '~/components/design/RevisionList.vue'
import { sizeText } from '~/utils/size-label'

describe('shop home table', () => {
  it('shows name, size label, latest revision, author and a link per design', async () => {
    const wrapper = await mountSuspended(DesignTable, {
      props: {
        designs: [
          { id: '11111111-1111-4111-8111-111111111111', name: 'Birch', sizeLabel: 'S', show: null, latestRevision: 4, updatedAt: '2026-11-02T15:00:00.000Z', author: 'Ana', quantity: 1, archivedAt: null, parentDesignId: null, tubeDiameter: 406.4 },
          { id: '22222222-2222-4222-8222-222222222222', name: 'Elm', sizeLabel: null, show: null, latestRevision: 1, updatedAt: '2026-11-03T15:00:00.000Z', author: null, quantity: 1, archivedAt: '2026-11-04T15:00:00.000Z', parentDesignId: null, tubeDiameter: null },
        ],
        canRestore: true,
      },
    })
    const rows = wrapper.findAll('tbody tr')
    expect(rows).toHaveLength(2)
    expect(rows[0]!.text()).toContain('Birch')
    expect(rows[0]!.text()).toContain('r4')
    expect(rows[0]!.text()).toContain('Ana')
    expect(rows[1]!.text()).toContain('—')
    // The tube from the latest revision stands beside the label: 406.4 mm is 16 in exactly.
    expect(rows[0]!.text()).toMatch(/S\s*·\s*(16(\s?in|")|406\.4\s?mm)\s*tube/)
    // Only the archived design offers to come back.
    expect(rows[0]!.text()).not.toContain('Restore')
    expect(rows[1]!.text()).toContain('archived')
    await rows[1]!.find('button').trigger('click')
    expect(wrapper.emitted('restore')).toEqual([['22222222-2222-4222-8222-222222222222']])
    expect(rows[0]!.find('a').attributes('href')).toBe('/designs/11111111-1111-4111-8111-111111111111')
  })
})

describe('revision history', () => {
  it('marks the latest revision and shows notes and authors', async () => {
    const wrapper = await mountSuspended(RevisionList, {
      props: {
        current: 2,
        loading: false,
        revisions: [
          { id: 'b', number: 2, note: 'Longer roots', createdAt: '2026-11-02T16:00:00.000Z', author: { id: 'u', name: 'Ana' } },
          { id: 'a', number: 1, note: '', createdAt: '2026-11-02T15:00:00.000Z', author: { id: null, name: null } },
        ],
      },
    })
    const items = wrapper.findAll('li')
    expect(items[0]!.text()).toContain('latest')
    expect(items[1]!.text()).not.toContain('latest')
    expect(items[1]!.text()).toContain('No note')
    expect(items[1]!.text()).toContain('Former member')
  })

  it('says so when there are no revisions', async () => {
    const wrapper = await mountSuspended(RevisionList, { props: { current: 0, loading: false, revisions: [] } })
    expect(wrapper.text()).toContain('No revisions yet')
  })
})

describe('the size shown for a design', () => {
  const fmt = (mm: number) => `${Math.round((mm / 25.4) * 16) / 16} in`
  it('puts the tube of the latest revision beside the label, and never repeats or trusts a length in the label', () => {
    // Tubes by hand: 12 in = 304.8 mm, 16 in = 406.4 mm, 20 in = 508 mm.
    expect(sizeText('Medium', 406.4, fmt)).toEqual({ label: 'Medium', tube: '16 in tube', mismatch: false })
    expect(sizeText('Medium · 16 in tube', 406.4, fmt)).toEqual({ label: 'Medium · 16 in tube', tube: null, mismatch: false })
    expect(sizeText('20"', 304.8, fmt)).toEqual({ label: '20"', tube: '12 in tube', mismatch: true })
    expect(sizeText('Large 500 mm', 508, fmt)).toEqual({ label: 'Large 500 mm', tube: null, mismatch: false })
    expect(sizeText(null, null, fmt)).toEqual({ label: null, tube: null, mismatch: false })
  })
})
