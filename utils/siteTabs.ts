// The sections of the site page and which one the address asks for.
/** A section of the site page. */
export type SiteTab = 'overview' | 'hydrology' | 'months' | 'options' | 'review' | 'sharing' | 'attachments'
  | 'consents' | 'commissioning'

/** Sections in the order shown. */
export const SITE_TABS: readonly { id: SiteTab; label: string }[] = [
  { id: 'overview', label: 'Overview' },
  { id: 'hydrology', label: 'Hydrology' },
  { id: 'months', label: 'Months' },
  { id: 'options', label: 'Design options' },
  { id: 'consents', label: 'Consents' },
  { id: 'review', label: 'Review' },
  { id: 'sharing', label: 'Landowner links' },
  { id: 'attachments', label: 'Photos and documents' },
  { id: 'commissioning', label: 'Commissioning' },
]

/** The section named by `?tab=`, or the overview. */
export function siteTabFrom(query: unknown): SiteTab {
  return SITE_TABS.find((t) => t.id === query)?.id ?? 'overview'
}
