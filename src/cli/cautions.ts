/** The cautions of the trade, shown in --help and the README (REFERENCES.md, Cautions). */
export const CAUTIONS = `Cautions
  - RF exposure: a transmitter under test can exceed exposure limits near its antenna. Prefer
    conducted tests into a dummy load; keep to your national exposure limits.
  - Protect the receiver: never connect a transmitter straight to a receiver or SDR input. Use a
    dummy load rated for the power and a calibrated attenuator or coupler, so the level at the
    receiver stays well below its damage limit.
  - Transmitting needs a licence (or an exemption) for the band, power and mode; receiving and
    recording some services may be restricted where you are.
  - Results are indicative: they depend on the receiver's calibration (frequency reference, gain
    flatness, IQ balance, dynamic range). Local regulation and the licence decide what applies;
    formal compliance evidence comes from an accredited test laboratory.`;
