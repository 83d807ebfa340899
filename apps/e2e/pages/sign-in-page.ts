import { expect, type Page } from '@playwright/test';

/** The sign-in screen, located by role and label. */
export class SignInPage {
  constructor(private readonly page: Page) {}

  async goto() {
    await this.page.goto('/sign-in');
    await expect(this.page.getByRole('heading', { level: 1 })).toBeVisible();
  }

  async signIn(email: string, password: string) {
    await this.page.getByLabel('E-mail').fill(email);
    await this.page.getByLabel('Password', { exact: true }).fill(password);
    await this.page.getByRole('button', { name: 'Sign in' }).click();
  }

  /** The navigation rail's link names, in order. */
  async navLinks(): Promise<string[]> {
    const nav = this.page.getByRole('navigation', { name: 'Main' });
    await expect(nav).toBeVisible();
    return (await nav.getByRole('link').allInnerTexts()).map((t) => t.trim());
  }
}
