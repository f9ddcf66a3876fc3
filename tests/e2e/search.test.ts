import { describe, expect, it } from 'vitest';
import { useBrowserApp } from '../support/e2e';

const app = useBrowserApp();

describe('search in Chromium', () => {
  it('"/" focuses the header search, results appear as you type, Enter opens the full results page', async () => {
    const page = await app.openPage();
    await app.signIn(page, 'tom');
    await page.getByRole('heading', { name: 'My bench runs in progress' }).waitFor();

    await page.keyboard.press('/');
    const box = page.getByRole('combobox', { name: 'Search approved procedures' });
    expect(await box.evaluate((el) => el === document.activeElement)).toBe(true);
    await page.keyboard.type('bleder retrofit');
    const option = page.getByRole('option').filter({ hasText: 'bleeder resistor retrofit' });
    await option.waitFor();
    expect(await option.locator('mark').count()).toBeGreaterThan(0);

    await page.keyboard.press('Enter');
    await page.waitForURL(/\/search\?q=/);
    await page.getByRole('heading', { name: 'Search approved procedures' }).waitFor();
    await page.getByRole('link', { name: /bleeder resistor retrofit/i }).waitFor();

    await page.getByLabel('Search words').fill('zzqqxx');
    await page.getByRole('button', { name: 'Search' }).click();
    await page.getByText('No approved procedure matches all of your words.').waitFor();
    expect(await page.getByRole('heading', { name: 'Matches some of your words' }).count()).toBe(0);
    // Nothing found says where to go next: the procedure list.
    expect(
      await page
        .locator('[data-search-empty]')
        .getByRole('link', { name: 'browse every procedure' })
        .getAttribute('href'),
    ).toBe('/procedures');

    // A misspelt word beside one the library lacks: the nearest spelling is offered as a link.
    await page.getByLabel('Search words').fill('bleedr zzqqxx');
    await page.getByRole('button', { name: 'Search' }).click();
    const suggestion = page.locator('[data-search-empty]').getByRole('link', { name: 'bleeder zzqqxx' });
    await suggestion.waitFor();
    await suggestion.press('Enter');
    await page.waitForURL(/\/search\?q=bleeder(\+|%20)zzqqxx$/);
    expect(await page.getByLabel('Search words').inputValue()).toBe('bleeder zzqqxx');

    // Two letters swapped are one slip: the procedures with the word are found.
    await page.getByLabel('Search words').fill('hetaer');
    await page.getByRole('button', { name: 'Search' }).click();
    await page
      .getByText(/showing results for/)
      .filter({ hasText: 'heater' })
      .waitFor();
    expect(
      await page
        .getByRole('list', { name: 'Procedures matching all of your words' })
        .getByRole('listitem')
        .count(),
    ).toBeGreaterThan(0);

    // Something the library does not cover: said plainly, partial matches only under their own heading.
    await page.getByLabel('Search words').fill('speaker cone repair');
    await page.getByRole('button', { name: 'Search' }).click();
    await page.getByText('No approved procedure matches all of your words.').waitFor();
    await page.getByRole('heading', { name: 'Matches some of your words' }).waitFor();
    expect(await page.getByRole('list', { name: 'Procedures matching all of your words' }).count()).toBe(0);
    const partial = page.getByRole('list', { name: 'Matches some of your words' });
    expect(await partial.getByRole('listitem').count()).toBeGreaterThan(0);
    expect(await partial.getByRole('listitem').first().textContent()).toMatch(/Does not mention: .*cone/);

    // A model code typed without its dash finds the procedure.
    await page.getByLabel('Search words').fill('tc30h bleeder');
    await page.getByRole('button', { name: 'Search' }).click();
    await page
      .getByRole('list', { name: 'Procedures matching all of your words' })
      .getByRole('link', { name: /bleeder resistor retrofit/i })
      .waitFor();
    expect(app.cspViolations).toEqual([]);
    await page.context().close();
  });
});
