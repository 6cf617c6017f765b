// The currency money figures are shown in. A page about one site gives its site's currency (the
// site's organisation's, which a single-site reviewer is no member of) to everything below it;
// elsewhere it is the organisation's, from the signed-in person's memberships.
import type { ComputedRef, InjectionKey, Ref } from 'vue'
import { DEFAULT_CURRENCY, type Currency } from '#shared/schemas/organisation'

const CURRENCY_KEY: InjectionKey<Ref<Currency | null | undefined>> = Symbol('currency')

/** Makes `currency` the one every money figure below this component shows (a site page gives its site's). */
export function provideCurrency(currency: Ref<Currency | null | undefined>): void {
  provide(CURRENCY_KEY, currency)
}

/** The currency here: the one a page gave, else organisation `orgId`'s (the current organisation's when not named), else pounds. */
export function useCurrency(orgId?: MaybeRefOrGetter<number | null | undefined>): ComputedRef<Currency> {
  const given = inject(CURRENCY_KEY, null)
  const org = useOrganisationStore()
  return computed(() => {
    if (given?.value) return given.value
    const id = toValue(orgId)
    const membership = id === undefined ? org.current : org.memberships.find((m) => m.orgId === id)
    return membership?.currency ?? DEFAULT_CURRENCY
  })
}
