import { FormArray, FormControl, FormGroup } from '@angular/forms';
import type { FieldDescriptions } from '../records/record-fields';
import { emailAddress, maxChars, phoneNumber, RECORD_RULES, textOrNull } from '../records/record-rules';
import { requiredWith } from '../shell/validators';
import type { ContactPerson, CreateCustomer, Customer } from './customers.api';

/** How a customer's fields read in the change history and the "changed meanwhile" dialog. */
export const CUSTOMER_FIELDS: FieldDescriptions = {
  name: { label: 'name' },
  email: { label: 'e-mail address' },
  phone: { label: 'phone number' },
  siteAddress: { label: 'site address' },
  notes: { label: 'notes' },
  contacts: {
    label: 'contact persons',
    format: (value) =>
      (value as ContactPerson[])
        .map((contact) => (contact.role ? `${contact.name} (${contact.role})` : contact.name))
        .join(', '),
  },
};

/** One contact person's fields. */
export type ContactGroup = FormGroup<{
  name: FormControl<string>;
  role: FormControl<string>;
  email: FormControl<string>;
  phone: FormControl<string>;
}>;

/** The customer form: the API's field names, so that the server's field errors find their controls. */
export type CustomerForm = FormGroup<{
  name: FormControl<string>;
  email: FormControl<string>;
  phone: FormControl<string>;
  siteAddress: FormControl<string>;
  notes: FormControl<string>;
  contacts: FormArray<ContactGroup>;
}>;

const text = (value: string, validators: ReturnType<typeof maxChars>[]) =>
  new FormControl(value, { nonNullable: true, validators });

/** A contact person's fields, filled from a stored one or empty. */
export function contactGroup(contact?: ContactPerson): ContactGroup {
  return new FormGroup({
    name: text(contact?.name ?? '', [
      requiredWith('Enter the contact’s name.'),
      maxChars(RECORD_RULES.contactNameMaxLength, 'Keep the contact’s name to 100 characters.'),
    ]),
    role: text(contact?.role ?? '', [
      maxChars(RECORD_RULES.contactRoleMaxLength, 'Keep the contact’s role to 60 characters.'),
    ]),
    email: text(contact?.email ?? '', [emailAddress()]),
    phone: text(contact?.phone ?? '', [phoneNumber()]),
  });
}

/** An empty customer form. */
export function customerForm(): CustomerForm {
  return new FormGroup({
    name: text('', [
      requiredWith('Enter the customer’s name.'),
      maxChars(RECORD_RULES.customerNameMaxLength, 'Keep the customer’s name to 120 characters.'),
    ]),
    email: text('', [emailAddress()]),
    phone: text('', [phoneNumber()]),
    siteAddress: text('', [
      maxChars(RECORD_RULES.siteAddressMaxLength, 'Keep the site address to 500 characters.'),
    ]),
    notes: text('', [maxChars(RECORD_RULES.notesMaxLength, 'Keep the notes to 4000 characters.')]),
    contacts: new FormArray<ContactGroup>([]),
  });
}

/** Fills the form from a stored customer. */
export function fillCustomerForm(form: CustomerForm, customer: Customer): void {
  form.controls.contacts.clear();
  for (const contact of customer.contacts) form.controls.contacts.push(contactGroup(contact));
  form.patchValue({
    name: customer.name,
    email: customer.email ?? '',
    phone: customer.phone ?? '',
    siteAddress: customer.siteAddress ?? '',
    notes: customer.notes ?? '',
  });
}

/** A contact as the API takes it: the optional fields left out when blank. */
function contactRequest(contact: {
  name: string;
  role?: string;
  email?: string;
  phone?: string;
}): ContactPerson {
  const role = textOrNull(contact.role);
  const email = textOrNull(contact.email);
  const phone = textOrNull(contact.phone);
  return {
    name: contact.name.trim(),
    ...(role ? { role } : {}),
    ...(email ? { email: email.toLowerCase() } : {}),
    ...(phone ? { phone } : {}),
  };
}

/** The form's value as the API takes it. */
export function customerRequest(form: CustomerForm): CreateCustomer & { contacts: ContactPerson[] } {
  const value = form.getRawValue();
  return {
    name: value.name.trim(),
    email: textOrNull(value.email)?.toLowerCase() ?? null,
    phone: textOrNull(value.phone),
    siteAddress: textOrNull(value.siteAddress),
    notes: textOrNull(value.notes),
    contacts: value.contacts.map(contactRequest),
  };
}

/** A stored customer's fields shaped as `customerRequest` shapes them, to find what a form changed. */
export function customerFields(customer: Customer): CreateCustomer & { contacts: ContactPerson[] } {
  return {
    name: customer.name,
    email: customer.email,
    phone: customer.phone,
    siteAddress: customer.siteAddress,
    notes: customer.notes,
    contacts: customer.contacts.map((contact) =>
      contactRequest({
        name: contact.name,
        role: contact.role ?? '',
        email: contact.email ?? '',
        phone: contact.phone ?? '',
      }),
    ),
  };
}
