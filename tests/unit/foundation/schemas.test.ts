import { describe, expect, it } from 'vitest'
import { LoginSchema, SignupSchema } from '../../../shared/schemas/auth'
import { IdSchema, PageQuerySchema } from '../../../shared/schemas/common'
import { canAdminister, canEdit, canReview, ROLES } from '../../../shared/utils/roles'
import { InputError, validator } from '../../../server/utils/validate'

describe('validator', () => {
  const signup = validator(SignupSchema, 'body')

  it('returns the parsed value with e-mail trimmed and lower-cased, unknown keys dropped', () => {
    const out = signup({ name: ' Ann ', email: ' Ann@Example.ORG ', password: 'long enough pw', organisationName: 'Org', role: 'admin' })
    expect(out).toEqual({ name: 'Ann', email: 'ann@example.org', password: 'long enough pw', organisationName: 'Org' })
  })

  it('names the first bad field in the message and lists every issue', () => {
    try {
      signup({ name: '', email: 'nope', password: 'x' })
      expect.unreachable()
    } catch (error) {
      expect(error).toBeInstanceOf(InputError)
      const e = error as InputError
      expect(e.message).toMatch(/^name: .* \(and 3 more\)$/)
      expect(e.issues.map((i) => i.path)).toEqual(['name', 'email', 'password', 'organisationName'])
    }
  })

  it('treats a missing body as an empty object, so the message still names a field', () => {
    expect(() => validator(LoginSchema, 'body')(undefined)).toThrow(/^email:/)
  })

  it('names the whole input when it is not an object', () => {
    expect(() => validator(LoginSchema, 'body')([])).toThrow(/^body:/)
  })
})

describe('common schemas', () => {
  it('coerce ids from route text and refuse non-integers', () => {
    expect(IdSchema.parse('42')).toBe(42)
    for (const bad of ['abc', '1.5', '0', '-3', '']) expect(IdSchema.safeParse(bad).success, bad).toBe(false)
  })

  it('default and cap paging', () => {
    expect(PageQuerySchema.parse({})).toEqual({ page: 1, pageSize: 50 })
    expect(PageQuerySchema.safeParse({ pageSize: '1000' }).success).toBe(false)
  })
})

describe('role checks', () => {
  it('match the product brief: admins administer, engineers and admins edit, reviewers review', () => {
    expect(ROLES).toEqual(['admin', 'engineer', 'reviewer', 'viewer'])
    expect(ROLES.filter(canAdminister)).toEqual(['admin'])
    expect(ROLES.filter(canEdit)).toEqual(['admin', 'engineer'])
    expect(ROLES.filter(canReview)).toEqual(['admin', 'reviewer'])
    expect(canEdit(null)).toBe(false)
  })
})
