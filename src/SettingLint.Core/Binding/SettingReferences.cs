using SettingLint.Core.Model;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Binding;

/// <summary>What a protection setting's relative units refer to, read off a bound motor (for relay ranges, which are bound per motor).</summary>
internal static class SettingReferences
{
    /// <summary>The key path of the ground CT.</summary>
    public const string GroundCt = "transformers.ground_ct";

    /// <summary>The key path of the phase CT.</summary>
    public const string PhaseCt = "transformers.phase_ct";

    /// <summary>A source of bound numbers by key path; a struct, so that looking up references allocates nothing.</summary>
    internal interface INumbers
    {
        double? Get(string path);
    }

    /// <summary>
    /// The references of a setting path: its element's CT (or the VT), the motor's FLC and rated voltage, over a source
    /// of bound numbers (a bound motor, or the binder's values before the document exists).
    /// </summary>
    internal static ConversionReferences For<T>(T numbers, string? groundConnection, string settingPath, bool voltage)
        where T : INumbers
    {
        var flc = numbers.Get("motor.full_load_current");
        var vr = numbers.Get("motor.rated_voltage");
        if (voltage)
        {
            var vp = numbers.Get("transformers.vt.primary");
            var vs = numbers.Get("transformers.vt.secondary");
            return new ConversionReferences(vp is > 0 && vs is > 0 ? vp / vs : null, flc, null, vr, vp is > 0 ? vp : null);
        }
        var ground = DocumentBinder.CtOf(settingPath, groundConnection) == GroundCt;
        var cp = numbers.Get(ground ? GroundCt + ".primary" : PhaseCt + ".primary");
        var cs = numbers.Get(ground ? GroundCt + ".secondary" : PhaseCt + ".secondary");
        return new ConversionReferences(cp is > 0 && cs is > 0 ? cp / cs : null, flc, cp is > 0 ? cp : null, vr, null, cs is > 0 ? cs : null);
    }

    /// <summary>A motor document's numbers.</summary>
    internal readonly struct DocumentNumbers(BoundDocument motor) : INumbers
    {
        public double? Get(string path) => motor.Measure(path)?.Value;
    }

    /// <summary>
    /// The references of one motor's settings, looked up once per transformer they are measured through (the VT, the
    /// phase CT, the ground CT) and kept for every other setting measured through it.
    /// </summary>
    internal struct ByTransformer
    {
        private ConversionReferences? _vt;
        private ConversionReferences? _phase;
        private ConversionReferences? _ground;

        public ConversionReferences Get<T>(T numbers, string? groundConnection, string settingPath, bool voltage)
            where T : INumbers
        {
            ref var memo = ref voltage ? ref _vt : ref DocumentBinder.CtOf(settingPath, groundConnection) == GroundCt ? ref _ground : ref _phase;
            return memo ??= For(numbers, groundConnection, settingPath, voltage);
        }
    }
}
