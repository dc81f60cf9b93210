/** Submits the Stripe stand-in's hosted onboarding form as a browser would, without following the redirect. */
export interface OnboardingValues {
  businessType?: string
  firstName?: string
  lastName?: string
  dob?: string
  ssnLast4?: string
  addressLine1?: string
  postalCode?: string
  routingNumber?: string
  accountNumber?: string
  tosAccepted?: boolean
  document?: string
}

/**
 * Test values from Stripe's Connect testing guide (from memory): date of birth 1901-01-01 verifies;
 * routing 110000000 and account 000123456789 are the test bank account that pays out.
 */
export const VERIFIED_PERSON: OnboardingValues = {
  businessType: 'individual',
  firstName: 'Jenny',
  lastName: 'Rosen',
  dob: '1901-01-01',
  ssnLast4: '0000',
  addressLine1: 'address_full_match',
  postalCode: '97214',
  routingNumber: '110000000',
  accountNumber: '000123456789',
  tosAccepted: true,
}

export async function submitOnboarding(
  url: string,
  values: OnboardingValues,
): Promise<{ status: number; location: string | null; html: string }> {
  const form = new URLSearchParams()
  for (const [name, value] of Object.entries(values)) {
    if (typeof value === 'boolean') {
      if (value) form.set(name, 'on')
    } else if (value !== undefined) form.set(name, value)
  }
  const response = await fetch(url, {
    method: 'POST',
    headers: { 'Content-Type': 'application/x-www-form-urlencoded' },
    body: form,
    redirect: 'manual',
  })
  return { status: response.status, location: response.headers.get('location'), html: await response.text() }
}
