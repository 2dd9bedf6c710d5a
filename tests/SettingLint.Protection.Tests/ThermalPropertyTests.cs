using CsCheck;
using SettingLint.Tests.Shared;

namespace SettingLint.Protection.Tests;

// Properties of the IEC 60255-149 thermal model, checked on random inputs.
public sealed class ThermalPropertyTests
{
    private static readonly ThermalModel Model = new(105, 900, 2700);

    // IEC 60255-149: for a fixed start level, more current trips sooner.
    [Trait("Category", "Property")]
    [Fact]
    public void TripTimeFallsAsCurrentRises_Iec60255_149() =>
        Gen.Select(Gen.Double[1.01, 20], Gen.Double[0.01, 10], Gen.Double[0, 0.99]).SampleSeeded((multiple, extra, level) =>
        {
            var lower = Model.TripTimeFrom(multiple * 105, level);
            var higher = Model.TripTimeFrom((multiple + extra) * 105, level);
            Assert.True(lower.Trips && higher.Trips);
            Assert.True(higher.Seconds < lower.Seconds);
        });

    // IEC 60255-149: at a fixed current, a hotter start trips sooner.
    [Trait("Category", "Property")]
    [Fact]
    public void HotterStartTripsSooner_Iec60255_149() =>
        Gen.Select(Gen.Double[1.01, 20], Gen.Double[0, 0.9], Gen.Double[0.01, 0.09]).SampleSeeded((multiple, level, extra) =>
        {
            var cooler = Model.TripTimeFrom(multiple * 105, level);
            var hotter = Model.TripTimeFrom(multiple * 105, level + extra);
            Assert.True(hotter.Seconds < cooler.Seconds);
        });

    // IEC 60255-149: cooling while stopped follows h0 exp(-t / tau_cool), so cooling for the cooling time lands on the target.
    [Trait("Category", "Property")]
    [Fact]
    public void CoolingForCoolingTime_ReachesTarget_Iec60255_149() =>
        Gen.Select(Gen.Double[0.05, 0.99], Gen.Double[0.01, 0.99]).SampleSeeded((start, share) =>
        {
            var cooled = start * share;
            var coolTime = Model.CoolingTime(start, cooled);
            Assert.NotNull(coolTime);
            Assert.Equal(cooled, start * Math.Exp(-coolTime.Value / Model.CoolingTimeConstant), 1e-9);
        });

    // IEC 60255-149: running to the computed trip time lands exactly on level 1.
    [Trait("Category", "Property")]
    [Fact]
    public void RunningForTripTime_ReachesLevelOne_Iec60255_149() =>
        Gen.Select(Gen.Double[1.05, 20], Gen.Double[0, 0.99]).SampleSeeded((multiple, level) =>
        {
            var time = Model.TripTimeFrom(multiple * 105, level);
            Assert.Equal(1.0, Model.LevelAfterRunning(level, multiple * 105, time.Seconds), 1e-9);
        });

    // IEC 60255-149: running t1 then t2 equals running t1 + t2 (first-order model has no memory beyond h).
    [Trait("Category", "Property")]
    [Fact]
    public void RunningComposes_Iec60255_149() =>
        Gen.Select(Gen.Double[0, 10], Gen.Double[0, 1], Gen.Double[0, 600], Gen.Double[0, 600]).SampleSeeded((multiple, level, first, second) =>
        {
            var current = multiple * 105;
            var twoSteps = Model.LevelAfterRunning(Model.LevelAfterRunning(level, current, first), current, second);
            Assert.Equal(Model.LevelAfterRunning(level, current, first + second), twoSteps, 1e-9);
        });
}
