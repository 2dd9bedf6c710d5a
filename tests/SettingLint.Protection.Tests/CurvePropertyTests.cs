using CsCheck;
using SettingLint.Tests.Shared;

namespace SettingLint.Protection.Tests;

public sealed class CurvePropertyTests
{
    // IEC 60255-151 Table 1 / IEEE C37.112-2018 Table 1: every inverse curve is strictly
    // decreasing in M above pickup.
    [Trait("Category", "Property")]
    [Fact]
    public void TripTimeFallsAsMultipleRises_Iec60255_151_IeeeC37_112() =>
        Gen.Select(Gen.Int[0, 6], Gen.Double[1.01, 30], Gen.Double[0.05, 10], Gen.Double[0.05, 10]).SampleSeeded((index, multiple, extra, dial) =>
        {
            var kind = (CurveKind)index;
            var lower = InverseTimeCurves.OperateTime(kind, multiple, dial);
            var higher = InverseTimeCurves.OperateTime(kind, multiple + extra, dial);
            Assert.True(higher.Seconds < lower.Seconds);
        });
}
