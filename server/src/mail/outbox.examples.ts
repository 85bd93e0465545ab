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
      attachments: [],
    },
    {
      id: 13,
      from: 'Counterpoise <no-reply@counterpoise.test>',
      to: ['office@fernhollow-clearing.test'],
      subject: 'Service report J-000042 from Ridgeline Rotor Service',
      text: 'Hello,\n\nThe service report of job J-000042, revision 1, signed by Juno Hartwell, is attached.\n',
      html: null,
      receivedAt: '2026-05-04T09:12:00.000Z',
      attachments: [
        { id: 3, filename: 'report-J-000042-r1.pdf', contentType: 'application/pdf', byteSize: 48213 },
      ],
    },
  ],
};
