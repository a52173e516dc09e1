/**
 * Download links are short-lived: with NUXT_S3_DOWNLOAD_LINK_SECONDS=1 a link works at once
 * and is refused by the object store once its second has passed.
 */
import { expect, it } from 'vitest'
import { demo, eventually, useServer } from '../support/server'
import { demoRecords, uploadForm } from './genotypes-support'

const server = useServer({ env: { NUXT_S3_DOWNLOAD_LINK_SECONDS: '1' } })

it('a download link works, then expires', async () => {
  const records = await demoRecords(server)
  const biologist = await server.signIn(demo.biologist)
  const created = await uploadForm(biologist, `/api/subpopulations/${records.subpopulations['Owlfeather Bald']}/attachments`, { name: 'notes.txt', content: 'Field notes (invented).\n' })
  expect(created.status).toBe(201)
  const link = await biologist.get(`/api/attachments/${created.body.id}/download`)
  expect(link.body.expiresInSeconds).toBe(1)
  const first = await fetch(link.body.url)
  expect(first.status).toBe(200)
  expect(await first.text()).toBe('Field notes (invented).\n')
  const refused = await eventually(async () => {
    const again = await fetch(link.body.url)
    return again.status === 403 ? await again.text() : undefined
  }, 5000)
  expect(refused).toMatch(/Request has expired/)
  // A fresh link works again.
  const fresh = await biologist.get(`/api/attachments/${created.body.id}/download`)
  expect((await fetch(fresh.body.url)).status).toBe(200)
})
