import type { Meta, StoryObj } from '@storybook/angular-vite';
import { expect } from 'storybook/test';
import { SAFETY_TOPICS } from './safety-cautions';
import { CpSafetyNotice } from './safety-notice';

// The model for every widget's stories: one story per meaningful state, a play function where behaviour
// matters, and the axe check that .storybook/preview.ts turns on for all of them.

/**
 * The cautions that belong to a moment of the job, always ending by deferring to the machine manual, the
 * site's rules and local codes. Import it from `@counterpoise/ng/core`.
 */
const meta: Meta<CpSafetyNotice> = {
  title: 'Core/Safety notice',
  component: CpSafetyNotice,
  tags: ['autodocs'],
  argTypes: {
    topics: { control: 'check', options: SAFETY_TOPICS },
    heading: { control: 'text' },
    compact: { control: 'boolean' },
  },
  args: { heading: 'Safety first', topics: [], compact: false },
};

export default meta;
type Story = StoryObj<CpSafetyNotice>;

/** Every caution, each with its detail: the notice of the safety page. */
export const Default: Story = {
  play: async ({ canvas }) => {
    const notice = canvas.getByRole('note', { name: 'Safety first' });
    await expect(notice).toBeVisible();
    await expect(canvas.getAllByRole('listitem')).toHaveLength(6);
    await expect(notice).toHaveTextContent(/local codes/);
  },
};

/** Only the cautions of the moment at hand: here, before the welder comes out. */
export const Topics: Story = {
  args: { heading: 'Before welding the correction weight', topics: ['hot-work', 'weights'] },
  play: async ({ canvas }) => {
    await expect(canvas.getByRole('note', { name: 'Before welding the correction weight' })).toBeVisible();
    const items = canvas.getAllByRole('listitem');
    await expect(items.map((item) => item.querySelector('strong')?.textContent)).toEqual([
      'Hot work near fuel and debris.',
      'Check every weight before the run.',
    ]);
  },
};

/** Titles only, each detail one tap away: for a sidebar or a phone. */
export const Compact: Story = {
  args: { heading: 'Before every run', topics: ['running', 'weights'], compact: true },
  play: async ({ canvas, userEvent }) => {
    const titles = canvas.getAllByRole('group').map((details) => details.querySelector('summary'));
    const [first, second] = titles;
    await expect(titles).toHaveLength(3);
    await expect(canvas.getByText(/Put every guard and cover back/)).not.toBeVisible();

    // Each title is a tab stop; Enter and Space on a focused summary are the browser's own behaviour.
    await userEvent.tab();
    await expect(first).toHaveFocus();
    await userEvent.tab();
    await expect(second).toHaveFocus();

    await userEvent.click(first!);
    await expect(canvas.getByText(/Put every guard and cover back/)).toBeVisible();
    await expect(first!.closest('details')).toHaveAttribute('open');
  },
};

/**
 * A dealer's own brand colours, set through the notice's custom properties alone. In a portal's Sass the
 * same comes from `@include notice.overrides((accent-color: #7a3e00, ...))` of `_safety-notice-theme.scss`.
 */
export const DealerBrand: Story = {
  args: { heading: 'Safety first on every service call', topics: ['lockout', 'protection'] },
  render: (args) => ({
    props: args,
    styles: [
      `.dealer-portal {
        --cp-safety-notice-accent-color: #7a3e00;
        --cp-safety-notice-container-color: #fff4e0;
        --cp-safety-notice-text-color: #2b1a00;
        --cp-safety-notice-secondary-text-color: #5c3d12;
        --cp-safety-notice-shape: 0;
      }`,
    ],
    template: `
      <div class="dealer-portal">
        <cp-safety-notice [heading]="heading" [topics]="topics" [compact]="compact" />
      </div>`,
  }),
  play: async ({ canvas }) => {
    const notice = canvas.getByRole('note', { name: 'Safety first on every service call' });
    const style = getComputedStyle(notice);
    await expect(style.borderInlineStartColor).toBe('rgb(122, 62, 0)');
    await expect(style.backgroundColor).toBe('rgb(255, 244, 224)');
    await expect(style.borderRadius).toBe('0px');
  },
};

/** The cautions in a portal of the dark colour scheme. */
export const DarkScheme: Story = { ...Default, globals: { scheme: 'dark' } };
