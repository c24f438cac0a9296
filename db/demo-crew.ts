/**
 * The invented demo scenario: a coastal robotics club at an invented field. No real people or
 * brands; the e-mail domain is reserved for examples (RFC 2606 §3).
 */
export const demoPassword = "tidewater-demo";

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
