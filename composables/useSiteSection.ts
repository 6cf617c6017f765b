// One editable section of the site page (overview, months): its form, saving with the version
// last read, and the 409 a stale version gets when someone else saved first.
import type { SiteDto, SitePatch } from '~~/shared/schemas/site'
import { isConflict } from '../utils/serverErrors'
import { draftFromSite } from '../utils/siteDraft'
import { patchSite } from './useSite'
import { type SiteForm, useSiteForm } from './useSiteForm'

/**
 * Form state for a section of `site`. `build` checks the section's fields into a PATCH; a save
 * hands the stored site to `onSaved`. While the draft is unchanged, a newer site (a save from
 * another section, a reload) flows into it; edits in progress are kept.
 */
export function useSiteSection(site: Ref<SiteDto>, build: (form: SiteForm, version: number) => SitePatch | null, onSaved: (site: SiteDto) => void) {
  const form = useSiteForm(draftFromSite(site.value))
  const conflict = ref(false)
  const saved = ref(false)

  watch(
    () => site.value,
    (next) => {
      if (!form.dirty.value || conflict.value) {
        form.reset(draftFromSite(next))
        conflict.value = false
      }
    },
  )

  async function save() {
    saved.value = false
    const patch = build(form, site.value.version)
    if (!patch) return
    form.busy.value = true
    try {
      const stored = await patchSite(site.value.id, patch)
      form.reset(draftFromSite(stored))
      onSaved(stored)
      saved.value = true
    } catch (error) {
      if (isConflict(error)) conflict.value = true
      else form.fail(error)
    } finally {
      form.busy.value = false
    }
  }

  /** Drops the edits and shows the stored site again. */
  function discard() {
    form.reset(draftFromSite(site.value))
    saved.value = false
  }

  return { form, conflict, saved, save, discard }
}
