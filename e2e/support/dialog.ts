import type { Locator, Page } from 'playwright-core';

/**
 * The open dialog, once Material has finished opening it: its container is open and no longer opening, and the
 * focus has moved inside it. Material moves the focus to the first field on a timer that ends with the open
 * animation; a fill typed before then can have its focus taken mid-way and its text land in another field (or
 * nowhere), which a slow machine never shows because the timer has long fired by the time it types.
 */
export async function openedDialog(page: Page): Promise<Locator> {
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  await page.waitForFunction(
    () => {
      const container = document.querySelector('.mat-mdc-dialog-container');
      return (
        container !== null &&
        container.classList.contains('mdc-dialog--open') &&
        !container.classList.contains('mdc-dialog--opening') &&
        container.contains(document.activeElement)
      );
    },
    undefined,
    { timeout: 10_000 },
  );
  return dialog;
}
