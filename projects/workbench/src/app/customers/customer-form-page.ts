import {
  afterNextRender,
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  Injector,
  input,
  type OnInit,
} from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_FORM_FIELD_DEFAULT_OPTIONS, MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { RecordFormError, RecordFormFrame, RecordSaveBar } from '../records/record-form-frame';
import { FORM_FIELD_OPTIONS, RecordForm } from '../records/record-form';
import { idFromRoute } from '../records/record-page';
import { RECORD_RULES } from '../records/record-rules';
import type { HoldsUnsavedInput } from '../records/unsaved-changes';
import { errorMessage } from '../shell/validators';
import {
  contactGroup,
  CUSTOMER_FIELDS,
  customerFields,
  customerForm,
  customerRequest,
  fillCustomerForm,
} from './customer-form-model';
import { CustomersApi } from './customers.api';
import { EmailField } from '../forms/email-field';

/**
 * Adding a customer or changing one: a name is enough, an e-mail address is usual; contact persons are
 * added and removed in place. Only the fields changed are sent, with the version they were changed on.
 */
@Component({
  selector: 'app-customer-form-page',
  imports: [
    EmailField,
    RecordFormError,
    RecordFormFrame,
    RecordSaveBar,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    ReactiveFormsModule,
  ],
  templateUrl: './customer-form-page.html',
  styleUrl: './customer-form-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // Messages under a field take the room they need, so that two lines never run into the next field.
  providers: [{ provide: MAT_FORM_FIELD_DEFAULT_OPTIONS, useValue: FORM_FIELD_OPTIONS }],
  host: { '(window:beforeunload)': 'warnBeforeUnload($event)' },
})
export class CustomerFormPage implements OnInit, HoldsUnsavedInput {
  /** The customer's id when editing; absent when adding one. */
  readonly id = input<string>();

  private readonly host = inject(ElementRef<HTMLElement>);
  private readonly injector = inject(Injector);
  protected readonly form = customerForm();
  protected readonly editing = new RecordForm({
    api: inject(CustomersApi),
    noun: 'customer',
    fields: CUSTOMER_FIELDS,
    form: this.form,
    request: () => customerRequest(this.form),
    fieldsOf: customerFields,
    fill: (customer) => fillCustomerForm(this.form, customer),
    pageOf: (customer) => `/customers/${customer.id}`,
  });
  protected readonly isNew = computed(() => this.id() === undefined);
  protected readonly maxContacts = RECORD_RULES.maxContacts;
  protected readonly errorMessage = errorMessage;

  ngOnInit(): void {
    const id = this.id();
    if (id === undefined) return;
    const recordId = idFromRoute(id);
    if (recordId === null) this.editing.loadError.set('This address names no customer.');
    else this.editing.load(recordId);
  }

  hasUnsavedInput(): boolean {
    return this.editing.hasUnsavedInput();
  }

  protected warnBeforeUnload(event: BeforeUnloadEvent): void {
    if (this.hasUnsavedInput()) event.preventDefault();
  }

  protected addContact(): void {
    this.form.controls.contacts.push(contactGroup());
    this.form.markAsDirty();
    const index = this.form.controls.contacts.length - 1;
    this.focus(`#contact-${index}-name`);
  }

  protected removeContact(index: number): void {
    this.form.controls.contacts.removeAt(index);
    this.form.markAsDirty();
    this.focus(
      this.form.controls.contacts.length > 0 ? `#contact-${Math.max(0, index - 1)}-name` : '#add-contact',
    );
  }

  private focus(selector: string): void {
    afterNextRender(
      () => (this.host.nativeElement as HTMLElement).querySelector<HTMLElement>(selector)?.focus(),
      {
        injector: this.injector,
      },
    );
  }
}
