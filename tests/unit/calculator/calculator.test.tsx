import { renderToString } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { Calculator } from '@/features/calculator/components/calculator';

describe('calculator page', () => {
  it('renders every derived quantity as a ledger line, the caution and the note on absent lines', () => {
    const html = renderToString(<Calculator />);
    expect(html).toContain('Derived values are estimates from simple models');
    expect(html).toContain('does not mean the element is absent');
    // The sixteen derived quantities of PRODUCT.md.
    expect(html.match(/data-quantity="/g)).toHaveLength(16);
    expect(html).toContain('Needs a parallax.');
    // Air wavelengths from the NIST Atomic Spectra Database as quoted in standard line lists (REFERENCES.md, "Strong lines").
    expect(html).toContain('Hα 656.279 nm (air)');
    expect(html).toContain('Ca II K 393.3663 nm (air)');
  });
});
