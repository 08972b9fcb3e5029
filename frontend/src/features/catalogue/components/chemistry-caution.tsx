/**
 * The usual cautions beside toner chemistry. The product records what was done; it does not
 * instruct anyone to mix or use these solutions.
 */
export function ChemistryCaution() {
  return (
    <aside aria-label="Chemical safety" className="rounded border border-sepia-200 bg-sepia-50 px-3 py-2 text-xs text-sepia-800">
      <p>
        <strong className="font-semibold">Chemical safety.</strong> Toning and after-bath solutions can be hazardous:
        ferricyanides must never meet strong acids or heat; concentrated acetic acid is corrosive; mix and handle only
        with gloves, eye protection and good ventilation. Follow the safety data sheet of each chemical, local
        regulations and your institution's health-and-safety practice. This record describes what was done; it is not
        an instruction, and decisions on treatment rest with qualified conservators.
      </p>
    </aside>
  );
}
