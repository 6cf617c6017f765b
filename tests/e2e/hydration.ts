import type { Page } from 'playwright-core'

/**
 * Makes every full page load of `page` wait until Nuxt reports hydration done. A server-rendered
 * form is on screen before Vue hydrates it, and what a journey types before then is lost.
 */
export function waitForHydrationOnLoad(page: Page): void {
  const goto = page.goto.bind(page)
  page.goto = (async (url: string, options?: Parameters<Page['goto']>[1]) => {
    const response = await goto(url, options)
    await page.waitForFunction(() => {
      type NuxtRoot = Element & { __vue_app__?: { config: { globalProperties: { $nuxt?: { isHydrating?: boolean } } } } }
      const app = (document.querySelector('#__nuxt') as NuxtRoot | null)?.__vue_app__
      return app?.config.globalProperties.$nuxt?.isHydrating === false
    })
    return response
  }) as Page['goto']
}
