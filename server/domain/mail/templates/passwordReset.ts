import { renderMail, type RenderedMail } from './layout'

/** To an account holder who asked to reset their password. */
export function passwordResetMail(v: { name: string; link: string; minutes: number }): RenderedMail {
  return renderMail('Reset your Gillwatt password', `Hello ${v.name},`, [
    { p: 'Someone, probably you, asked to reset the password of your Gillwatt account. Choose a new password here:' },
    { link: v.link, label: 'Choose a new password' },
    { p: `The link works once, for ${v.minutes} minutes. If you did not ask, ignore this e-mail: your password stays as it is.` },
  ])
}
