/**
 * The review workflow table (shared/review/workflow.ts) for every role, status and relation to
 * the proposal. Expected verdicts are the rules of PRODUCT.md "Review and approval" and issue 7,
 * written out by hand here (common practice, no source beyond the product rules).
 */
import { describe, expect, it } from 'vitest'
import { allowedReviewActions, REVIEW_ACTIONS, reviewVerdict, waitsFor, type ReviewAction, type ReviewContext } from '../../../shared/review/workflow'
import { PROPOSAL_STATUSES, ROLES, type ProposalStatus, type Role } from '../../../shared/types/db'

const context = (status: ProposalStatus, role: Role, extra: Partial<ReviewContext> = {}): ReviewContext =>
  ({ status, role, isAuthor: false, reviewerId: null, userId: 10, ...extra })

/** The rules, independently of the table: may `role` (author or not) take `action` at `status`? */
function expected(action: ReviewAction, status: ProposalStatus, role: Role, isAuthor: boolean): boolean {
  const writer = role !== 'viewer'
  const decider = role === 'manager' || role === 'administrator'
  switch (action) {
    case 'submit': return writer && isAuthor && (status === 'draft' || status === 'returned')
    case 'approve':
    case 'return':
    case 'decline': return decider && !isAuthor && status === 'submitted'
    case 'withdraw': return writer && isAuthor && (status === 'submitted' || status === 'returned')
    case 'reassign': return role === 'administrator' && ['draft', 'submitted', 'returned'].includes(status)
    case 'revise': return writer && ['approved', 'declined', 'withdrawn'].includes(status)
  }
}

describe('reviewVerdict', () => {
  for (const action of REVIEW_ACTIONS) {
    it(`${action}: every role × status × authorship`, () => {
      for (const role of ROLES) {
        for (const status of PROPOSAL_STATUSES) {
          for (const isAuthor of [false, true]) {
            const verdict = reviewVerdict(action, context(status, role, { isAuthor }))
            expect(verdict.allowed, `${action} by ${role}${isAuthor ? ' (author)' : ''} at ${status}`).toBe(expected(action, status, role, isAuthor))
          }
        }
      }
    })
  }

  it('moves to the right status', () => {
    expect(reviewVerdict('submit', context('draft', 'biologist', { isAuthor: true }))).toEqual({ allowed: true, to: 'submitted' })
    expect(reviewVerdict('submit', context('returned', 'biologist', { isAuthor: true }))).toEqual({ allowed: true, to: 'submitted' })
    expect(reviewVerdict('approve', context('submitted', 'manager'))).toEqual({ allowed: true, to: 'approved' })
    expect(reviewVerdict('return', context('submitted', 'manager'))).toEqual({ allowed: true, to: 'returned' })
    expect(reviewVerdict('decline', context('submitted', 'administrator'))).toEqual({ allowed: true, to: 'declined' })
    expect(reviewVerdict('withdraw', context('submitted', 'manager', { isAuthor: true }))).toEqual({ allowed: true, to: 'withdrawn' })
    expect(reviewVerdict('revise', context('approved', 'biologist'))).toEqual({ allowed: true, to: null })
  })

  it('refuses self-approval with 403 and the separation-of-duties reason, even for administrators', () => {
    for (const role of ['manager', 'administrator'] as const) {
      expect(reviewVerdict('approve', context('submitted', role, { isAuthor: true }))).toEqual({
        allowed: false, status: 403,
        reason: 'You wrote this proposal, so you cannot decide on it: another manager must review it (separation of duties).',
      })
    }
  })

  it('with a reviewer assigned, only that reviewer or an administrator decides', () => {
    const assigned = { reviewerId: 42, reviewerName: 'Jordan Halvorsen' }
    expect(reviewVerdict('approve', context('submitted', 'manager', { ...assigned, userId: 42 })).allowed).toBe(true)
    expect(reviewVerdict('approve', context('submitted', 'administrator', assigned)).allowed).toBe(true)
    expect(reviewVerdict('approve', context('submitted', 'manager', assigned))).toEqual({
      allowed: false, status: 403, reason: 'This proposal is assigned to Jordan Halvorsen for review. An administrator can reassign it to you.',
    })
  })

  it('answers 409 (not 403) when the status moved on — the second of two deciders', () => {
    const late = reviewVerdict('decline', context('approved', 'manager'))
    expect(late).toEqual({ allowed: false, status: 409, reason: 'This proposal was approved; a decision was already recorded, so yours was not. Reload to see it.' })
    expect(reviewVerdict('approve', context('draft', 'manager'))).toMatchObject({ status: 409, reason: expect.stringMatching(/once its author submits it/) })
  })

  it('answers 403 for a role that may never take the action, whatever the status', () => {
    expect(reviewVerdict('approve', context('approved', 'viewer'))).toMatchObject({ allowed: false, status: 403 })
    expect(reviewVerdict('submit', context('approved', 'viewer', { isAuthor: true }))).toMatchObject({ allowed: false, status: 403 })
    expect(reviewVerdict('reassign', context('submitted', 'manager'))).toMatchObject({ allowed: false, status: 403, reason: expect.stringMatching(/Only administrators/) })
  })
})

describe('allowedReviewActions and waitsFor', () => {
  it('lists what a person may do now', () => {
    expect(allowedReviewActions(context('submitted', 'manager'))).toEqual(['approve', 'return', 'decline'])
    expect(allowedReviewActions(context('submitted', 'administrator'))).toEqual(['approve', 'return', 'decline', 'reassign'])
    expect(allowedReviewActions(context('draft', 'biologist', { isAuthor: true }))).toEqual(['submit'])
    expect(allowedReviewActions(context('returned', 'biologist', { isAuthor: true }))).toEqual(['submit', 'withdraw'])
    expect(allowedReviewActions(context('approved', 'viewer'))).toEqual([])
  })

  it('a submitted proposal waits for managers who may decide on it, not for its author', () => {
    expect(waitsFor(context('submitted', 'manager'))).toBe(true)
    expect(waitsFor(context('submitted', 'manager', { isAuthor: true }))).toBe(false)
    expect(waitsFor(context('submitted', 'biologist'))).toBe(false)
    expect(waitsFor(context('returned', 'manager'))).toBe(false)
  })
})
