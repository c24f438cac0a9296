/**
 * The invented demo scenario: a coastal robotics club at an invented field. No real people or
 * brands; the e-mail domain is reserved for examples (RFC 2606 §3).
 */
export const demoPassword = "tidewater-demo";

/** One row of a demo build's link sheet (db/schema/builds.ts buildChannels); channels not listed are unused. */
export interface DemoChannel {
  channel: number;
  function: "roll" | "pitch" | "throttle" | "yaw" | "arm" | "return-to-home" | "mission" | "mode" | "rssi" | "aux";
  switchLabel?: string;
  positions?: number;
  engageMinUs?: number;
  engageMaxUs?: number;
  failsafeUs?: number;
}

/**
 * The rovers' sheet matches what our simulator writes to ch1–ch8 (scripts/simulator/simulate-run.ts):
 * steering on 1, throttle on 2, arm on 5 (2000 µs armed), mission on 6 (1500 µs while the route
 * runs), return to home on 7 (2000 µs), which the receiver also puts out on link loss.
 */
const roverSheet: DemoChannel[] = [
  { channel: 1, function: "roll" },
  { channel: 2, function: "throttle" },
  { channel: 5, function: "arm", switchLabel: "A", positions: 2, engageMinUs: 1800, engageMaxUs: 2100 },
  { channel: 6, function: "mission", switchLabel: "B", positions: 3, engageMinUs: 1400, engageMaxUs: 1600, failsafeUs: 1000 },
  { channel: 7, function: "return-to-home", switchLabel: "C", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 2000 },
];

/** The quad's sheet, as its bench failsafe test logs it (scripts/simulator/bench-test.ts): RTH on 8, RSSI on 14. */
const quadSheet: DemoChannel[] = [
  { channel: 1, function: "roll" },
  { channel: 2, function: "pitch" },
  { channel: 3, function: "throttle" },
  { channel: 4, function: "yaw" },
  { channel: 5, function: "arm", switchLabel: "A", positions: 2, engageMinUs: 1800, engageMaxUs: 2100 },
  { channel: 6, function: "mode", switchLabel: "B", positions: 3 },
  { channel: 7, function: "mission", switchLabel: "C", positions: 3, engageMinUs: 1400, engageMaxUs: 1600, failsafeUs: 1000 },
  { channel: 8, function: "return-to-home", switchLabel: "D", positions: 2, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 1900 },
  { channel: 14, function: "rssi" },
];

export const demoCrew = {
  name: "Tidewater Robotics",
  members: [
    { email: "lead@tidewater.example", name: "Maren Ostby", role: "lead" as const },
    { email: "pilot@tidewater.example", name: "Jonah Reyes", role: "pilot" as const },
    { email: "observer@tidewater.example", name: "Priya Lindqvist", role: "observer" as const },
  ],
  builds: [
    {
      name: "Mudlark",
      vehicleType: "ground" as const,
      frame: "Four-wheel skid-steer chassis, 1:10",
      flightController: "Open-source rover controller board",
      firmware: "Open rover firmware",
      firmwareVersion: "4.5.1",
      receiver: "868 MHz long-range receiver",
      transmitter: "Hand-held 16-channel radio",
      bandMhz: 868,
      txPowerMw: 25,
      rxSensitivityDbm: -112,
      antennas: "Dipole on a 30 cm mast",
      batteryCells: 4,
      batteryCapacityMah: 5000,
      failsafeAction: "return-to-home" as const,
      failsafeWithinS: 1.5,
      linkSheet: roverSheet,
    },
    {
      name: "Sandpiper",
      vehicleType: "ground" as const,
      frame: "Six-wheel rocker chassis",
      receiver: "2.4 GHz receiver with telemetry",
      transmitter: "Hand-held 16-channel radio",
      bandMhz: 2440,
      txPowerMw: 100,
      rxSensitivityDbm: -105,
      antennas: "Two diversity antennas at 90°",
      batteryCells: 3,
      batteryCapacityMah: 4000,
      failsafeAction: "hold" as const,
      failsafeWithinS: 1,
      // Hold is a flight mode: the mode switch's third position, which the receiver's failsafe selects.
      linkSheet: [
        ...roverSheet.filter((c) => c.channel !== 7),
        { channel: 7, function: "return-to-home", switchLabel: "C", positions: 2, engageMinUs: 1800, engageMaxUs: 2100 },
        { channel: 8, function: "mode", switchLabel: "D", positions: 3, engageMinUs: 1800, engageMaxUs: 2100, failsafeUs: 1900 },
      ] satisfies DemoChannel[],
    },
    {
      name: "Heron",
      vehicleType: "multirotor" as const,
      frame: "450 mm quad",
      receiver: "2.4 GHz receiver with telemetry",
      transmitter: "Hand-held 16-channel radio",
      bandMhz: 2440,
      txPowerMw: 100,
      rxSensitivityDbm: -105,
      antennas: "Two dipoles under the arms",
      batteryCells: 4,
      batteryCapacityMah: 3300,
      failsafeAction: "return-to-home" as const,
      failsafeWithinS: 1,
      linkSheet: quadSheet,
    },
  ],
  // An invented field on a stretch of coast: a loop around the flats and a short survey line.
  routePlans: [
    {
      name: "Flats loop",
      vehicleClass: "ground" as const,
      waypoints: [
        { name: "Home", lat: 53.47012, lon: -3.05211 },
        { name: "Slipway", lat: 53.47105, lon: -3.05102 },
        { name: "Dune post", lat: 53.47188, lon: -3.05245 },
        { name: "Channel marker", lat: 53.47121, lon: -3.05412 },
        { name: "Home", lat: 53.47012, lon: -3.05211 },
      ],
    },
    {
      name: "Survey line east",
      vehicleClass: "air" as const,
      waypoints: [
        { name: "Start", lat: 53.47030, lon: -3.05180 },
        { name: "East 1", lat: 53.47050, lon: -3.04900 },
        { name: "East 2", lat: 53.47070, lon: -3.04620 },
      ],
    },
  ],
};
