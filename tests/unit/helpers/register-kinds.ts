// Test setup: registers the sensor kinds, as the engine's façade does when it loads, so tests that
// import a lower layer directly (the resolver, the schema, a check) see every kind.
import '../../../server/src/sensors/kinds';
