import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  inject,
  input,
  type OnInit,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  type FormControl,
  ReactiveFormsModule,
  type ValidationErrors,
} from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { catchError, debounceTime, map, of, Subject, switchMap } from 'rxjs';
import { SEARCH_DEBOUNCE_MS } from '../records/list-query';
import { errorMessage } from '../shell/validators';
import { CustomersApi } from './customers.api';

/** A customer as a picker holds it: enough to name it and to send its id. */
export interface CustomerRef {
  readonly id: number;
  readonly name: string;
}

/** What a customer picker's control holds: the customer chosen, or the text typed to find one. */
export type CustomerChoice = CustomerRef | string | null;

/** Whether a picker's value is a chosen customer rather than text still being typed. */
export function isCustomerRef(value: CustomerChoice): value is CustomerRef {
  return typeof value === 'object' && value !== null;
}

/** Refuses typed text that is not a customer chosen from the list (an empty field passes). */
export function chosenCustomer(control: AbstractControl<CustomerChoice>): ValidationErrors | null {
  const value = control.value;
  if (value === null || value === '' || isCustomerRef(value)) return null;
  return { customer: 'Choose the customer from the list that opens as you type.' };
}

/** How many customers the list under the field offers at a time. */
const SUGGESTIONS = 10;

/**
 * A field that finds a customer as you type (by name, e-mail, phone…), asking the server, and holds the one
 * chosen: for the machine form and the machines list's filter. The control's value is the customer chosen
 * or, while typing, the text.
 */
@Component({
  selector: 'app-customer-picker',
  imports: [
    MatAutocompleteModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <mat-form-field appearance="outline" [subscriptSizing]="subscriptSizing()">
      <mat-label>{{ label() }}</mat-label>
      <mat-icon matPrefix aria-hidden="true" svgIcon="storefront" />
      <input
        matInput
        type="text"
        autocomplete="off"
        [formControl]="control()"
        [matAutocomplete]="suggestions"
        [required]="required()"
        (focus)="suggestOnFocus()"
      />
      @if (hasChoice()) {
        <button
          matIconButton
          matSuffix
          type="button"
          [attr.aria-label]="'Clear ' + label().toLowerCase()"
          (click)="clear()"
        >
          <mat-icon aria-hidden="true" svgIcon="close" />
        </button>
      }
      @if (hint(); as hint) {
        <mat-hint>{{ hint }}</mat-hint>
      }
      <mat-error>{{ errorMessage(control()) }}</mat-error>
      <mat-autocomplete #suggestions="matAutocomplete" [displayWith]="nameOf">
        @for (customer of options(); track customer.id) {
          <mat-option [value]="customer">{{ customer.name }}</mat-option>
        } @empty {
          @if (searched()) {
            <mat-option disabled>No customer in use matches.</mat-option>
          }
        }
      </mat-autocomplete>
    </mat-form-field>
  `,
  styles: `
    :host {
      display: block;
    }
    mat-form-field {
      width: 100%;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerPicker implements OnInit {
  /** The control that holds the choice. */
  readonly control = input.required<FormControl<CustomerChoice>>();
  /** The field's label. */
  readonly label = input('Customer');
  /** A hint under the field. */
  readonly hint = input<string | null>(null);
  /** Whether a customer must be chosen (marks the label). */
  readonly required = input(false);
  /** `dynamic` (the default) lets hints and messages take the lines they need; `fixed` keeps one line for them. */
  readonly subscriptSizing = input<'fixed' | 'dynamic'>('dynamic');

  private readonly api = inject(CustomersApi);
  private readonly destroyRef = inject(DestroyRef);
  protected readonly options = signal<readonly CustomerRef[]>([]);
  protected readonly searched = signal(false);
  private readonly value = signal<CustomerChoice>(null);
  private readonly searches = new Subject<string>();
  protected readonly hasChoice = computed(() => {
    const value = this.value();
    return isCustomerRef(value) || (typeof value === 'string' && value !== '');
  });
  protected readonly errorMessage = errorMessage;

  ngOnInit(): void {
    const control = this.control();
    this.value.set(control.value);
    control.valueChanges.pipe(takeUntilDestroyed(this.destroyRef)).subscribe((value) => {
      this.value.set(value);
      if (!isCustomerRef(value)) this.searches.next(value ?? '');
    });
    this.searches
      .pipe(
        debounceTime(SEARCH_DEBOUNCE_MS),
        switchMap((text) =>
          this.api.list({ q: text.trim() || undefined, pageSize: SUGGESTIONS, sort: 'name' }).pipe(
            map((page) => page.items.map(({ id, name }) => ({ id, name }))),
            catchError(() => of([])),
          ),
        ),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe((customers) => {
        this.options.set(customers);
        this.searched.set(true);
      });
  }

  /** The first suggestions come when the field is first used, so that a page never asks for them unused. */
  protected suggestOnFocus(): void {
    if (this.searched()) return;
    const value = this.control().value;
    this.searches.next(isCustomerRef(value) ? '' : (value ?? ''));
  }

  protected readonly nameOf = (value: CustomerChoice): string =>
    isCustomerRef(value) ? value.name : (value ?? '');

  protected clear(): void {
    this.control().setValue(null);
    this.control().markAsDirty();
  }
}
