import { expect, test } from '@playwright/test';
import { DEMO, signIn } from './helpers';

/**
 * Team programming's groups in the browser: an admin makes a group of demo athletes from the Groups page,
 * edits its members and archives it. The group has no coach, so no one's access changes for the other tests.
 */
test('an admin creates a group of demo athletes, changes its members and archives it', async ({ page }, testInfo) => {
  const name = `Outfield ${testInfo.project.name} ${Date.now().toString(36)}`;
  await signIn(page, DEMO.admin.email);
  await page.getByRole('link', { name: 'Groups', exact: true }).first().click();
  await expect(page.getByRole('heading', { level: 1, name: 'Groups' })).toBeVisible();

  const form = page.getByRole('form', { name: 'New group' });
  await form.getByLabel('Group name').fill(name);
  await form.getByLabel('Kind').selectOption('position');
  const athletes = form.getByRole('group', { name: 'Athletes' });
  await athletes.getByLabel(DEMO.sam.name).check();
  await athletes.getByLabel(DEMO.ava.name).check();
  await form.getByRole('button', { name: 'Create group' }).click();

  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
  await expect(page.getByText('Position group · 2 athletes')).toBeVisible();
  const members = page.getByRole('form', { name: 'Members' });
  await expect(members.getByLabel(DEMO.sam.name)).toBeChecked();
  await members.getByLabel(DEMO.luis.name).check();
  await members.getByRole('button', { name: 'Save members' }).click();
  await expect(page.getByText('Members saved. Who sees whom follows at once.')).toBeVisible();
  await expect(page.getByText('Position group · 3 athletes')).toBeVisible();

  await page.getByRole('button', { name: 'Archive this group' }).click();
  await page.getByRole('button', { name: `Archive ${name}` }).click();
  await expect(page.getByRole('main')).toContainText('Archived');
  // Kept for the record, and changed no more.
  await expect(page.getByRole('form', { name: 'Members' })).toHaveCount(0);
  await expect(page.getByRole('region', { name: 'Team programs' })).toHaveCount(0);
  await expect(page.getByText(`Athletes: ${DEMO.ava.name}, ${DEMO.luis.name}, ${DEMO.sam.name}`)).toBeVisible();
});
