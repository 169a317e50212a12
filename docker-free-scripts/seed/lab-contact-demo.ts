import type { EntityManager } from 'typeorm';

/** Invented contact and shipping details for the demo labs (no real address, phone or mailbox). */
const DEMO_CONTACTS: Record<string, { contactEmail: string; contactPhone: string; shippingAddress: string; shippingInstructions: string }> = {
  'Calder Analytical': {
    contactEmail: 'lab@calder.test',
    contactPhone: '+44 1632 960412 (invented)',
    shippingAddress: 'Calder Analytical — Sample Receipt\n4 Millrace Yard, Calderbrook\nDemoshire DM1 4CA (invented address)',
    shippingInstructions: 'Ship Monday to Wednesday so samples do not wait over a weekend. Keep bottles upright and cool; enclose the signed custody form.',
  },
  'Marlow Test House': {
    contactEmail: 'lab@marlow.test',
    contactPhone: '+44 1632 960877 (invented)',
    shippingAddress: 'Marlow Test House — Goods In\n12 Weir Lane, Marlow Green\nDemoshire DM9 2MT (invented address)',
    shippingInstructions: 'Pack each container in its own sealed bag with the printed label on the outside.',
  },
};

/** Fills the demo labs' contact and shipping details where still empty; never overwrites an edit. */
export async function seedLabContacts(manager: EntityManager): Promise<void> {
  for (const [name, c] of Object.entries(DEMO_CONTACTS)) {
    await manager.query(
      `UPDATE lab SET
         contact_email = CASE WHEN contact_email = '' THEN $2 ELSE contact_email END,
         contact_phone = CASE WHEN contact_phone = '' THEN $3 ELSE contact_phone END,
         shipping_address = CASE WHEN shipping_address = '' THEN $4 ELSE shipping_address END,
         shipping_instructions = CASE WHEN shipping_instructions = '' THEN $5 ELSE shipping_instructions END
       WHERE name = $1 AND is_demo`,
      [name, c.contactEmail, c.contactPhone, c.shippingAddress, c.shippingInstructions],
    );
  }
}
