using SettingLint.Core.Model;
using SettingLint.Core.Quantities;

namespace SettingLint.Core.Binding;

/// <summary>What a protection setting's relative units refer to, read off a bound motor (for relay ranges, which are bound per motor).</summary>
public static class SettingReferences
{
    /// <summary>The references of a setting path: its element's CT (or the VT), the motor's FLC and rated voltage.</summary>
    public static ConversionReferences For(BoundDocument motor, string settingPath, bool voltage) =>
        For(p => motor.Measure(p)?.Value, motor.Text("transformers.ground_ct.connection"), settingPath, voltage);

    /// <summary>The same, over any source of bound numbers (the binder uses it before the document exists).</summary>
    public static ConversionReferences For(Func<string, double?> Get, string? groundConnection, string settingPath, bool voltage)
    {
        var flc = Get("motor.full_load_current");
        var vr = Get("motor.rated_voltage");
        if (voltage)
        {
            var vp = Get("transformers.vt.primary");
            var vs = Get("transformers.vt.secondary");
            return new ConversionReferences(vp is > 0 && vs is > 0 ? vp / vs : null, flc, null, vr);
        }
        var ct = DocumentBinder.CtOf(DocumentBinder.ElementOf(settingPath), groundConnection);
        var cp = Get(ct + ".primary");
        var cs = Get(ct + ".secondary");
        return new ConversionReferences(cp is > 0 && cs is > 0 ? cp / cs : null, flc, cp is > 0 ? cp : null, vr);
    }
}
