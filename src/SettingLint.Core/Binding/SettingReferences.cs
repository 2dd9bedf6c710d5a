using SettingLint.Core.Model;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Binding;

/// <summary>What a protection setting's relative units refer to, read off a bound motor (for relay ranges, which are bound per motor).</summary>
public static class SettingReferences
{
    /// <summary>The references of a setting path: its element's CT (or the VT), the motor's FLC and rated voltage.</summary>
    public static ConversionReferences For(BoundDocument motor, string settingPath, bool voltage) =>
        For(new Document(motor), motor.Text("transformers.ground_ct.connection"), settingPath, voltage);

    /// <summary>The same, over any source of bound numbers (the binder uses it before the document exists).</summary>
    public static ConversionReferences For(Func<string, double?> get, string? groundConnection, string settingPath, bool voltage) =>
        For(new Function(get), groundConnection, settingPath, voltage);

    /// <summary>A source of bound numbers by key path; a struct, so that looking up references allocates nothing.</summary>
    internal interface INumbers
    {
        double? Get(string path);
    }

    internal static ConversionReferences For<T>(T numbers, string? groundConnection, string settingPath, bool voltage)
        where T : INumbers
    {
        var flc = numbers.Get("motor.full_load_current");
        var vr = numbers.Get("motor.rated_voltage");
        if (voltage)
        {
            var vp = numbers.Get("transformers.vt.primary");
            var vs = numbers.Get("transformers.vt.secondary");
            return new ConversionReferences(vp is > 0 && vs is > 0 ? vp / vs : null, flc, null, vr);
        }
        var ground = DocumentBinder.CtOf(DocumentBinder.ElementOf(settingPath), groundConnection) == "transformers.ground_ct";
        var cp = numbers.Get(ground ? "transformers.ground_ct.primary" : "transformers.phase_ct.primary");
        var cs = numbers.Get(ground ? "transformers.ground_ct.secondary" : "transformers.phase_ct.secondary");
        return new ConversionReferences(cp is > 0 && cs is > 0 ? cp / cs : null, flc, cp is > 0 ? cp : null, vr);
    }

    private readonly struct Document(BoundDocument motor) : INumbers
    {
        public double? Get(string path) => motor.Measure(path)?.Value;
    }

    private readonly struct Function(Func<string, double?> get) : INumbers
    {
        public double? Get(string path) => get(path);
    }
}
