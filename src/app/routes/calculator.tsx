import { Calculator } from '@/features/calculator/components/calculator';

/** The calculator's own module is loaded with this route, so other pages do not carry it. */
export function CalculatorRoute() {
  return (
    <>
      <title>Calculator · Starledger</title>
      <Calculator />
    </>
  );
}
