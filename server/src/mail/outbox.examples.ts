/*
 * The examples of the outbox route in the OpenAPI document. A spec parses each with its schema, so that the
 * reference never shows an example the server would refuse or never send. Invented people of the demo
 * organisation, on the reserved `.test` domain.
 */

export const OUTBOX_EXAMPLE = {
  messages: [
    {
      id: 12,
      from: 'Counterpoise <no-reply@counterpoise.test>',
      to: ['new.technician@ridgeline-rotor.test'],
      subject: 'Maren Oakhurst invites you to Ridgeline Rotor Service on Counterpoise',
      text: 'Hello,\n\nAccept the invitation: http://localhost:4300/accept-invitation?token=…\n',
      html: null,
      receivedAt: '2026-05-04T08:00:01.000Z',
    },
  ],
};
