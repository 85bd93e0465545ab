import { type BaseHarnessFilters, ComponentHarness, HarnessPredicate } from '@angular/cdk/testing';

/** Filters for finding a `cp-safety-notice`. */
export interface SafetyNoticeHarnessFilters extends BaseHarnessFilters {
  /** Only the notice whose heading matches. */
  heading?: string | RegExp;
}

/** Reads a `cp-safety-notice` in tests: its heading and the titles of its cautions. */
export class CpSafetyNoticeHarness extends ComponentHarness {
  static hostSelector = 'cp-safety-notice';

  private readonly _heading = this.locatorFor('.cp-safety-notice__heading');
  private readonly _titles = this.locatorForAll('.cp-safety-notice__title');
  private readonly _details = this.locatorForAll('details');

  /** A predicate that finds a notice by its heading. */
  static with(options: SafetyNoticeHarnessFilters = {}): HarnessPredicate<CpSafetyNoticeHarness> {
    return new HarnessPredicate(CpSafetyNoticeHarness, options).addOption(
      'heading',
      options.heading,
      (harness, heading) => HarnessPredicate.stringMatches(harness.getHeading(), heading),
    );
  }

  /** The heading text. */
  async getHeading(): Promise<string> {
    return (await this._heading()).text();
  }

  /** The titles of the cautions shown, in order, without their closing full stop. */
  async getCautionTitles(): Promise<string[]> {
    const titles = await this._titles();
    return Promise.all(titles.map(async (title) => (await title.text()).replace(/\.$/, '')));
  }

  /** Whether the details sit behind a tap (the compact variant). */
  async isCompact(): Promise<boolean> {
    return (await this.host()).hasClass('cp-safety-notice--compact');
  }

  /** Opens the detail of the caution at `index` in the compact variant. */
  async expandCaution(index: number): Promise<void> {
    const details = await this._details();
    const target = details[index];
    if (!target) throw new Error(`The notice has no caution at index ${index}.`);
    await (await this.locatorForAll('summary')())[index]?.click();
  }

  /** Whether the detail of the caution at `index` is open (always true when not compact). */
  async isCautionExpanded(index: number): Promise<boolean> {
    if (!(await this.isCompact())) return true;
    const target = (await this._details())[index];
    return (await target?.getProperty<boolean>('open')) ?? false;
  }
}
