// Chair-time templates and the chair-time calculation over HTTP, against real MariaDB.
import { afterAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug } from '../helpers/db'
import type { StoredTemplate } from '../../shared/types/templates'

afterAll(closeTestDb)

async function templateByCode(client: ApiClient, code: string): Promise<StoredTemplate> {
  const list = await client.get<StoredTemplate[]>('/api/templates')
  const found = list.body.find((template) => template.code === code)
  if (!found) throw new Error(`no template ${code}`)
  return found
}

function newTemplate(code: string) {
  return {
    code, name: `Test ${code}`, category: 'restorative', capability: 'restorative', needsTooth: true, needsSurfaces: true, region: 'posterior',
    steps: [
      { label: 'Seat', kind: 'assist', role: 'seat', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
      { label: 'Restore', kind: 'hands_on', role: 'treat', baseMinutes: 20, perExtraSurfaceMinutes: 10, perExtraToothMinutes: 0 },
      { label: 'Reset room', kind: 'reset', role: 'turnover', baseMinutes: 10, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    ],
    anaesthesia: {
      required: false,
      maxillary: { technique: 'infiltration', infiltration: { injectMinutes: 2, onsetMinutes: 3 }, block: { injectMinutes: 2, onsetMinutes: 10 } },
      mandibular: { technique: 'block', infiltration: { injectMinutes: 2, onsetMinutes: 3 }, block: { injectMinutes: 2, onsetMinutes: 10 } },
    },
  }
}

describe('templates API', () => {
  it('lists the seeded defaults to every signed-in role', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const response = await desk.get<StoredTemplate[]>('/api/templates')
    expect(response.status).toBe(200)
    expect(response.body.map((template) => template.code)).toEqual(expect.arrayContaining([
      'COMP-POST', 'COMP-ANT', 'SEAL', 'CLEAN-ADULT', 'CLEAN-CHILD', 'EXAM-NEW', 'EXAM-EMER', 'CROWN-PREP', 'EXT-SIMPLE',
    ]))
  })

  it('refuses template edits from front desk with 403 and from signed-out callers with 401', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const template = await templateByCode(desk, 'COMP-POST')
    expect((await desk.put(`/api/templates/${template.id}`, newTemplate('COMP-POST'))).status).toBe(403)
    expect((await desk.post('/api/templates', newTemplate('DESK-1'))).status).toBe(403)
    expect((await desk.delete(`/api/templates/${template.id}`)).status).toBe(403)
    expect((await new ApiClient().post('/api/templates', newTemplate('ANON-1'))).status).toBe(401)
  })

  it('saves an edit as a new version and keeps the old one readable', async () => {
    const manager = await signedInAs('manager@fernhollow.test')
    const created = await manager.post<StoredTemplate>('/api/templates', newTemplate('VERS-1'))
    expect(created.status).toBe(201)
    expect(created.body.version).toBe(1)
    const edited = { ...newTemplate('VERS-1'), name: 'Edited name' }
    const revised = await manager.put<StoredTemplate>(`/api/templates/${created.body.id}`, edited)
    expect(revised.status).toBe(200)
    expect(revised.body).toMatchObject({ code: 'VERS-1', version: 2, name: 'Edited name', current: true })
    const old = await manager.get<StoredTemplate>(`/api/templates/${created.body.id}`)
    expect(old.body).toMatchObject({ version: 1, name: 'Test VERS-1', current: false })
    expect((await templateByCode(manager, 'VERS-1')).version).toBe(2)
  })

  it('answers a duplicate code with 409 and deactivates on DELETE', async () => {
    const admin = await signedInAs('admin@fernhollow.test')
    const created = await admin.post<StoredTemplate>('/api/templates', newTemplate('DUP-1'))
    expect((await admin.post('/api/templates', newTemplate('DUP-1'))).status).toBe(409)
    const removed = await admin.delete<StoredTemplate>(`/api/templates/${created.body.id}`)
    expect(removed.body.active).toBe(false)
    const listed = await admin.get<StoredTemplate[]>('/api/templates')
    expect(listed.body.some((template) => template.code === 'DUP-1')).toBe(false)
  })

  it.each([
    ['steps', { steps: [] }],
    ['steps.1.baseMinutes', { steps: [newTemplate('X').steps[0], { ...newTemplate('X').steps[1], baseMinutes: -5 }, newTemplate('X').steps[2]] }],
    ['steps.1.kind', { steps: [newTemplate('X').steps[0], { ...newTemplate('X').steps[1], kind: 'waiting' }, newTemplate('X').steps[2]] }],
    ['category', { category: 'cosmetic' }],
    ['code', { code: 'no spaces allowed' }],
    ['name', { name: '' }],
  ])('names %s in the 400 for a bad template', async (field, change) => {
    const manager = await signedInAs('manager@fernhollow.test')
    const response = await manager.post('/api/templates', { ...newTemplate('BAD-1'), ...change })
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
  })

  it('refuses a numbing step typed into a template (onset comes from the anaesthesia settings)', async () => {
    const manager = await signedInAs('manager@fernhollow.test')
    const steps = [...newTemplate('X').steps]
    steps.splice(1, 0, { label: 'Wait', kind: 'numbing', role: 'treat', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 })
    const response = await manager.post('/api/templates', { ...newTemplate('NUMB-1'), steps })
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe('steps.1.kind')
  })
})

describe('POST /api/chair-time', () => {
  it('plans a two-surface posterior composite on a lower molar with its numbing wait', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const response = await desk.post('/api/chair-time', {
      siteId: await siteIdBySlug('quarry-street'),
      items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }],
    })
    expect(response.status).toBe(200)
    const plan = response.body
    expect(plan.unitMinutes).toBe(5)
    expect(plan.chairMinutes % 5).toBe(0)
    expect(plan.segments[0].startMinute).toBe(0)
    expect(plan.segments.at(-1).endMinute).toBe(plan.chairMinutes)
    expect(plan.segments.some((segment: { kind: string }) => segment.kind === 'numbing')).toBe(true)
    expect(plan.providerMinutes).toBeLessThan(plan.chairMinutes)
    expect(plan.explanation).toMatch(/block/i)
  })

  it('uses the site\'s booking unit (Saguaro Flats books in 15 minutes)', async () => {
    const admin = await signedInAs('admin@fernhollow.test')
    const response = await admin.post('/api/chair-time', {
      siteId: await siteIdBySlug('saguaro-flats'), items: [{ templateCode: 'COMP-POST', tooth: '36', notation: 'iso', surfaces: 'DO' }],
    })
    expect(response.status).toBe(200)
    expect(response.body.unitMinutes).toBe(15)
    expect(response.body.chairMinutes % 15).toBe(0)
  })

  it.each([
    ['items.0.tooth', { templateCode: 'COMP-POST', tooth: '33', surfaces: 'O' }, /33/],
    ['items.0.tooth', { templateCode: 'COMP-POST', tooth: '19', notation: 'iso', surfaces: 'O' }, /19/],
    ['items.0.surfaces', { templateCode: 'COMP-POST', tooth: '19', surfaces: 'MXO' }, /X/],
    ['items.0.surfaces', { templateCode: 'COMP-POST', tooth: '19', surfaces: 'MOO' }, /O/],
    ['items.0.surfaces', { templateCode: 'COMP-POST', tooth: '19', surfaces: 'I' }, /I/],
    ['items.0.templateCode', { templateCode: 'NOPE', tooth: '19', surfaces: 'O' }, /no such template/],
    ['items.0.templateId', { templateId: 999999, tooth: '19', surfaces: 'O' }, /no such template/],
    ['items.0.anaesthesia', { templateCode: 'COMP-POST', tooth: '19', surfaces: 'O', anaesthesia: 'gas' }, /none, infiltration or block/],
    ['items.0.notation', { templateCode: 'COMP-POST', tooth: '19', surfaces: 'O', notation: 'palmer' }, /universal or iso/],
  ])('answers 400 naming %s', async (field, item, reason) => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const response = await desk.post('/api/chair-time', { items: [item] })
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
    expect(response.body.data.reason).toMatch(reason)
  })

  it('answers 400 for an empty plan, 403 for a site outside the scope, 401 when signed out', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const empty = await desk.post('/api/chair-time', { items: [] })
    expect(empty.status).toBe(400)
    expect(empty.body.data.field).toBe('items')
    const elsewhere = await desk.post('/api/chair-time', { siteId: await siteIdBySlug('aspen-gulch'), items: [{ templateCode: 'SEAL', tooth: '3' }] })
    expect(elsewhere.status).toBe(403)
    expect((await new ApiClient().post('/api/chair-time', { items: [] })).status).toBe(401)
  })
})
