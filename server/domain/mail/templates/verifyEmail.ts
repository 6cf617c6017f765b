import { renderMail, type RenderedMail } from './layout'

/** To a new account: prove the address is theirs. */
export function verifyEmailMail(v: { name: string; link: string; hours: number }): RenderedMail {
  return renderMail('Confirm your e-mail address for Gillwatt', `Hello ${v.name},`, [
    { p: 'A Gillwatt account was created with this e-mail address. Confirm that the address is yours here:' },
    { link: v.link, label: 'Confirm my address' },
    { p: `The link works once, for ${v.hours} hours. Until the address is confirmed the account can sign in, but cannot join an organisation or accept an invitation.` },
    { p: 'If you did not create this account, ignore this e-mail; you can also take the account over by asking for a password reset with this address.' },
  ])
}

/** To an existing account holder when someone signs up again with their address. */
export function signupExistsMail(v: { name: string; resetLink: string }): RenderedMail {
  return renderMail('Someone tried to create a Gillwatt account with your address', `Hello ${v.name},`, [
    { p: 'Someone, perhaps you, just tried to create a new Gillwatt account with this e-mail address. You already have one, so nothing was created and nothing changed.' },
    { p: 'If it was you and you have forgotten your password, choose a new one here:' },
    { link: v.resetLink, label: 'Reset my password' },
    { p: 'If it was not you, you can ignore this e-mail.' },
  ])
}
