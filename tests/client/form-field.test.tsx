import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { FormField } from '../../src/components/form-field';

describe('FormField', () => {
  it('ties the label, hint and error to the input for screen readers', () => {
    render(<FormField label="E-mail" hint="We never show it" error="Enter a valid e-mail address" />);
    const input = screen.getByLabelText('E-mail');
    expect(input).toHaveAttribute('aria-invalid', 'true');
    expect(input).toHaveAccessibleDescription('We never show it Enter a valid e-mail address');
  });
});
