/** The cautions every page carries, in plain words (PRODUCT.md, "Cautions the product shows"). */
export const CAUTIONS: readonly { title: string; text: string }[] = [
  { title: 'Screening only', text: 'Figures here are screening estimates, not a design. Final design needs a licensed or chartered engineer and a site survey.' },
  { title: 'Rivers are dangerous', text: 'Work in and beside rivers risks drowning, sudden rises in flow and confined spaces in air shafts. Follow local safety rules.' },
  { title: 'Consents come first', text: 'In-river works need the consents of the local regulator: abstraction, flood risk, fish passage and water quality. Their figures replace Gillwatt\'s defaults.' },
  { title: 'Gas can harm fish', text: 'Injected air can supersaturate the water with dissolved gas, which harms fish. Check the gas flag on every assessment.' },
]
