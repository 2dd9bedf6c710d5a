namespace SettingLint.Core.Documents;

/// <summary>
/// The key paths of the setting-file schemas (schema/*.schema.json) that the C# code reads by name. They are here and
/// nowhere else, so that a test can resolve every one in its schema: a key renamed in a schema fails that test instead
/// of giving nulls in silence. Rules read key paths of their own; the compiler checks those against the schemas.
/// </summary>
public static class SchemaPaths
{
    /// <summary>Key paths of a motor-protection file (schema/motor-protection.schema.json).</summary>
    public static class Motor
    {
        public const string MotorPrefix = "motor.";
        public const string FullLoadCurrent = "motor.full_load_current";
        public const string RatedVoltage = "motor.rated_voltage";
        public const string LockedRotorCurrent = "motor.locked_rotor_current";
        public const string AccelerationTime = "motor.acceleration_time";
        public const string AccelerationTimeMax = "motor.acceleration_time_max";
        public const string StartingVoltageMin = "motor.starting_voltage_min";
        public const string SafeStallTimeCold = "motor.safe_stall_time_cold";
        public const string SafeStallTimeHot = "motor.safe_stall_time_hot";

        public const string StarterPrefix = "starter.";
        public const string StarterType = "starter.type";
        public const string SoftStartCurrentLimit = "starter.soft_start_current_limit";
        public const string InterruptingRating = "starter.interrupting_rating";

        public const string TransformersPrefix = "transformers.";
        public const string PhaseCt = "transformers.phase_ct";
        public const string PhaseCtPrimary = "transformers.phase_ct.primary";
        public const string PhaseCtSecondary = "transformers.phase_ct.secondary";
        public const string GroundCt = "transformers.ground_ct";
        public const string GroundCtPrimary = "transformers.ground_ct.primary";
        public const string GroundCtSecondary = "transformers.ground_ct.secondary";
        public const string GroundCtConnection = "transformers.ground_ct.connection";
        public const string Vt = "transformers.vt";
        public const string VtPrimary = "transformers.vt.primary";
        public const string VtSecondary = "transformers.vt.secondary";

        /// <summary>Above the protection elements; a setting's path is this, the element, a dot and its key.</summary>
        public const string ProtectionPrefix = "protection.";
        public const string ThermalEnabled = "protection.thermal.enabled";
        public const string ThermalPickup = "protection.thermal.pickup";
        public const string ThermalTimeConstant = "protection.thermal.time_constant";
        public const string ThermalCoolingTimeConstant = "protection.thermal.cooling_time_constant";
        public const string ThermalFullLoadLevel = "protection.thermal.full_load_level";
        public const string AccelerationEnabled = "protection.acceleration.enabled";
        public const string AccelerationTimer = "protection.acceleration.time";
        public const string ShortCircuitEnabled = "protection.short_circuit.enabled";
        public const string ShortCircuitPickup = "protection.short_circuit.pickup";
        public const string ShortCircuitDelay = "protection.short_circuit.delay";
        public const string ShortCircuitBlockedAbove = "protection.short_circuit.blocked_above";
        public const string GroundFault = "protection.ground_fault";
        public const string GroundFaultEnabled = "protection.ground_fault.enabled";
        public const string GroundFaultPickup = "protection.ground_fault.pickup";
        public const string GroundFaultDelay = "protection.ground_fault.delay";
    }

    /// <summary>Key paths of a bus file (schema/bus.schema.json), also of a bus written inline in a motor file.</summary>
    public static class Bus
    {
        public const string MaxVoltage = "max_voltage";
        public const string FaultCurrentMin = "fault_current_min";
        public const string FaultCurrentMax = "fault_current_max";
        public const string Grounding = "grounding";
        public const string GroundFaultCurrent = "ground_fault_current";
        public const string Frequency = "frequency";
        public const string Upstream = "upstream";
        public const string UpstreamCurve = "upstream.curve";
        public const string UpstreamPickup = "upstream.pickup";
        public const string UpstreamTimeMultiplier = "upstream.time_multiplier";
        public const string UpstreamInstantaneous = "upstream.instantaneous";
    }
}
