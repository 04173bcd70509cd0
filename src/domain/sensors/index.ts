/** Sensor data, pure: min/max decimation, per-channel summaries and limit excursions, the count timeline on the plot's axis. */
export * from './decimate';
export * from './summary';
export * from './timeline';
