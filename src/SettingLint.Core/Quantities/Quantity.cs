using System.Globalization;

namespace SettingLint.Core.Quantities;

/// <summary>A value as written: a number and a unit. Conversion to SI needs the context of its element.</summary>
public readonly record struct Quantity(double Number, Unit Unit)
{
    /// <summary>The canonical written form: number, one space, unit.</summary>
    public override string ToString() => Number.ToString("R", CultureInfo.InvariantCulture) + " " + Unit.Symbol;

    /// <summary>Converts to SI (A primary, V primary, s, W, ohm, fraction, Hz) with the references the unit needs.</summary>
    /// <returns>The SI value, or null when a reference the unit needs is missing (no FLC, no CT, no VT).</returns>
    public double? ToSi(in ConversionReferences refs)
    {
        var n = Number * Unit.Factor;
        return Unit.Basis switch
        {
            UnitBasis.Absolute or UnitBasis.Primary => n,
            UnitBasis.Secondary => refs.SideRatio is { } r ? n * r : null,
            UnitBasis.FullLoadCurrent => refs.FullLoadCurrent is { } flc ? n * flc : null,
            UnitBasis.CtRating => refs.CtPrimary is { } ct ? n * ct : null,
            UnitBasis.RatedVoltage => refs.RatedVoltage is { } vr ? n * vr : null,
            UnitBasis.VtRating => refs.VtPrimary is { } vp ? n * vp : null,
            UnitBasis.CtSecondaryPower => refs.CtSecondary is { } isn ? n / (isn * isn) : null,
            _ => null,
        };
    }
}

/// <summary>What relative units refer to: the element's transformer ratio, the motor's FLC and rated voltage.</summary>
/// <param name="SideRatio">Primary per secondary of the element's CT (or the VT for voltages).</param>
/// <param name="FullLoadCurrent">The motor's FLC, A.</param>
/// <param name="CtPrimary">The element's CT primary rating, A.</param>
/// <param name="RatedVoltage">The motor's rated voltage, V.</param>
/// <param name="VtPrimary">The VT's primary rating, V (for xVT).</param>
/// <param name="CtSecondary">The CT's rated secondary current, A (for a burden in VA).</param>
public readonly record struct ConversionReferences(double? SideRatio, double? FullLoadCurrent, double? CtPrimary, double? RatedVoltage, double? VtPrimary = null, double? CtSecondary = null);
