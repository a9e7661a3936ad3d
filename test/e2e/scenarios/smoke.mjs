// The editor loads with our extension installed: its command is in the palette.
import { waitForCommand, paletteRows } from '../lib/workbench.mjs';

export const smoke = {
  name: 'editor loads and "Loudword: Review distances" is in the command palette',
  slug: 'smoke-palette',
  async run({ page }) {
    await waitForCommand(page, 'Loudword: Review distances');
    await paletteRows(page, 'Loudword'); // left open for the screenshot
  },
};
