namespace SettingLint.Core.Model;

/// <summary>Which electrical code governs a motor's installation, as the rules read it (`config.electrical_code`).</summary>
internal static class ElectricalCodes
{
    /// <summary>The US National Electrical Code, whose 430.32 limits the overload pickup (SL801).</summary>
    public const string Nfpa70 = "NFPA 70";

    /// <summary>
    /// The governing code: the one the configuration declares for the file; when none is declared, NFPA 70 on a bus of
    /// 60 Hz or of unstated frequency (the contract's default is 60 Hz, and the default keeps what the tool always
    /// assumed), and none on a bus of another frequency, where NFPA 70 is not the code of the land.
    /// </summary>
    /// <param name="declared">`electrical_code` of the configuration that governs the file, or null.</param>
    /// <param name="busFrequency">The bus frequency in Hz, or null when the bus does not state one (or is not known).</param>
    public static string? Governing(string? declared, double? busFrequency) =>
        declared ?? (busFrequency is null || Math.Abs(busFrequency.Value - 60) < 0.5 ? Nfpa70 : null);
}
