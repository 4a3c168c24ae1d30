/** How to sign in to the embedded demo (printed by npm start; the README says the same). */
export const DEMO_PASSWORD_NOTE = [
  'Demo scenario: Corvid Lantern Games (fictional), teams "UI Motion" and "Gameplay Feel".',
].join('\n');
