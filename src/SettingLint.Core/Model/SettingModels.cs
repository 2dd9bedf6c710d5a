using System.Collections.Immutable;
using SettingLint.Core.Quantities;
using SettingLint.Core.Documents;

namespace SettingLint.Core.Model;

/// <summary>A bus: the supply several motors share.</summary>
public sealed record Bus(BoundDocument Document)
{
    public string Tag => Document.Tag;

    public string? Grounding => Document.Text(SchemaPaths.Bus.Grounding);

    /// <summary>The supply frequency in Hz when the bus states one (`frequency: 50 Hz`), else null.</summary>
    public double? Frequency => Document[SchemaPaths.Bus.Frequency] switch
    {
        MeasureValue m => m.Value,
        // Read from text too, so that the default of the electrical code does not depend on how the key is bound.
        TextValue t when double.TryParse(t.Value.Replace("Hz", "", StringComparison.Ordinal).Trim(), System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var f) => f,
        _ => null,
    };
}

/// <summary>One settable range of a relay model, kept as written because xFLC and xCT depend on the motor.</summary>
/// <param name="Setting">The protection key path it bounds, such as short_circuit.pickup.</param>
public sealed record RelayRange(string Setting, WrittenValue Min, WrittenValue Max, WrittenValue? Step);

/// <summary>What a relay can be set to.</summary>
public sealed record RelayModel(BoundDocument Document, ImmutableArray<RelayRange> Ranges)
{
    public string Tag => Document.Tag;

    /// <summary>The range of a setting, when the model has one.</summary>
    public RelayRange? RangeOf(string setting) => Ranges.FirstOrDefault(r => r.Setting == setting);
}

/// <summary>One protected motor: its own file bound, with its bus and relay model resolved.</summary>
/// <param name="Document">The motor's own values: motor, starter, transformers, protection.</param>
/// <param name="Bus">The bus it is fed from, when the reference resolved.</param>
/// <param name="RelayModel">The relay model, when given and resolved.</param>
public sealed record MotorProtection(BoundDocument Document, Bus? Bus, RelayModel? RelayModel)
{
    public string Tag => Document.Tag;

    /// <summary>The electrical code that governs the motor (<see cref="ElectricalCodes.Governing"/>); null when none is declared or implied.</summary>
    public string? ElectricalCode { get; init; }

    /// <summary>Whether a protection element is present and enabled, by the path of its flag (<see cref="SchemaPaths.Motor.ThermalEnabled"/>).</summary>
    public bool IsEnabled(string enabledPath) => Document.Flag(enabledPath) == true;
}
