import type { Role } from '../shared/utils/roles'

// The invented demo scenario: no real organisation, river, site or person. E-mail addresses use
// the reserved .example domain. Later features add their part of the story here.

/** Demo-only password shared by every demo account. Never use it anywhere real. */
export const DEMO_PASSWORD = 'brackwin-demo-2026'

export const DEMO_ORGANISATION = 'Tarn & Beck Renewables'

export interface DemoAccount {
  name: string
  email: string
  role: Role
  /** Who they are in the story. */
  story: string
}

export const DEMO_ACCOUNTS: readonly DemoAccount[] = [
  { name: 'Morwenna Hale', email: 'morwenna@tarnbeck.example', role: 'admin', story: 'administrator at Tarn & Beck Renewables' },
  { name: 'Idris Penrose', email: 'idris@tarnbeck.example', role: 'engineer', story: 'project engineer at Tarn & Beck Renewables' },
  { name: 'Elspeth Garrow', email: 'elspeth@fellside-agency.example', role: 'reviewer', story: 'environmental officer at the (invented) Fellside River Agency' },
  { name: 'Tobias Wren', email: 'tobias@brackwin-farm.example', role: 'viewer', story: 'landowner on the Brackwin Water' },
]
