/**
 * Workers that die or stop mid-run: the run is retried through pg-boss and gives exactly the
 * result it would have given (each replicate's random stream depends only on the seed and the
 * replicate's index) — also when the retry runs on a different number of threads.
 *
 * This file starts its own workers (no worker from the harness): a 1-thread worker that is
 * killed with SIGKILL in the middle of a run, then a 2-thread worker whose watchdog notices the
 * stale heartbeat after the 3-second test lease and makes pg-boss retry the job.
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { simulateRescue } from '../../shared/genetics'
import type { ApiClient } from '../support/client'
import { demo, useServer } from '../support/server'
import { rescueParameters, viaJson, waitForFinished, waitForRun } from './runs-support'

const server = useServer()
let biologist: ApiClient
let expected: unknown

const run = { model: 'rescue', parameters: rescueParameters, seed: 424242, replicates: 30 }

beforeAll(async () => {
  biologist = await server.signIn(demo.biologist)
  expected = viaJson(simulateRescue(rescueParameters, { seed: run.seed, replicates: run.replicates }))
}, 120_000)

describe('a worker killed mid-run', () => {
  it('the job is retried by another worker and gives the same result', async () => {
    const doomed = await server.startWorker({ TRIBUTARY_WORKER_THREADS: '1' })
    const response = await biologist.post('/api/runs', run)
    expect(response.status, JSON.stringify(response.body)).toBe(202)
    const id = response.body.id as number
    const midway = await waitForRun(biologist, id, current => current.status === 'running' && current.progress > 0)
    expect(midway.progress).toBeLessThan(1)
    await doomed.kill()
    expect(doomed.child.signalCode).toBe('SIGKILL')

    const rescuer = await server.startWorker({ TRIBUTARY_WORKER_THREADS: '2' })
    const done = await waitForFinished(biologist, id, 120_000)
    expect(done.status, done.error ?? undefined).toBe('succeeded')
    expect(done.attempts).toBe(2)
    expect(done.result).toEqual(expected)
    expect(rescuer.output()).toMatch(new RegExp(`run ${id}: no heartbeat for 3 s \\(attempt 1\\) — job retried`))
    expect(rescuer.output()).toMatch(new RegExp(`run ${id}: started \\(attempt 2`))
    await rescuer.stop()
  }, 180_000)
})

describe('threads and graceful stops', () => {
  it('the same seed on a 1-thread worker gives the same result as on 2 threads', async () => {
    const single = await server.startWorker({ TRIBUTARY_WORKER_THREADS: '1' })
    const response = await biologist.post('/api/runs', run)
    const done = await waitForFinished(biologist, response.body.id, 120_000)
    expect(done.status, done.error ?? undefined).toBe('succeeded')
    expect(done.attempts).toBe(1)
    expect(done.result).toEqual(expected)
    expect(single.output()).toMatch(/1 thread /)
    await single.stop()
  }, 180_000)

  it('a worker stopped with SIGTERM gives the run back; the next worker finishes it with the same result', async () => {
    const first = await server.startWorker({ TRIBUTARY_WORKER_THREADS: '1' })
    const response = await biologist.post('/api/runs', run)
    const id = response.body.id as number
    await waitForRun(biologist, id, current => current.status === 'running' && current.progress > 0)
    await first.stop()
    expect(first.output()).toMatch(new RegExp(`run ${id}: stopped by worker shutdown`))
    const requeued = await biologist.get(`/api/runs/${id}`)
    expect(requeued.body).toMatchObject({ status: 'queued', progress: 0 })

    const second = await server.startWorker({ TRIBUTARY_WORKER_THREADS: '2' })
    const done = await waitForFinished(biologist, id, 120_000)
    expect(done.status, done.error ?? undefined).toBe('succeeded')
    expect(done.attempts).toBe(2)
    expect(done.result).toEqual(expected)
    await second.stop()
  }, 180_000)
})
