using LaunchLogger.Cli.Bench;
using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Prescribed.Sensors;

namespace LaunchLogger.Cli.Tests.Bench;

/// <summary>The generated rolling starts again with pulses only on a driven wheel
/// (<see cref="BenchGroup.GeneratedRollingPulsesDriven"/>): made only when asked, after every other
/// record, so the bench without them is as it was.</summary>
public class RollingPulsesDrivenCaseTests
{
    [Fact]
    public void The_pulses_only_driven_copies_are_the_rolling_starts_again_and_leave_the_rest_as_it_was()
    {
        IReadOnlyList<PrescribedBenchCase> plain = PrescribedBenchCase.Build(80, 3, 100, calibratedTyre: false);
        IReadOnlyList<PrescribedBenchCase> told = PrescribedBenchCase.Build(80, 3, 100, calibratedTyre: false, rollingPulsesDriven: true, pickupWheelTold: true);
        IReadOnlyList<PrescribedBenchCase> notTold = PrescribedBenchCase.Build(80, 3, 100, calibratedTyre: false, rollingPulsesDriven: true);
        Assert.DoesNotContain(plain, c => c.Group == BenchGroup.GeneratedRollingPulsesDriven);
        Assert.Equal(plain.Select(c => (c.Index, c.Group, c.Summary)), told.Take(plain.Count).Select(c => (c.Index, c.Group, c.Summary)));

        PrescribedBenchCase[] rolling = told.Where(c => c.Group == BenchGroup.GeneratedRolling).ToArray();
        PrescribedBenchCase[] driven = told.Skip(plain.Count).ToArray();
        Assert.True(rolling.Length >= 4);
        Assert.Equal(rolling.Length, driven.Length);
        Assert.Equal(Enumerable.Range(100 + plain.Count, driven.Length), driven.Select(c => c.Index));

        // Real tyres' slip laws: share/(C·g0), C 15–30, a driven pair's share 1.4–2.3 (Pacejka ch. 1,
        // Gillespie ch. 2; from memory); no launch part, the record opens moving.
        double g0 = 9.80665;
        for (int i = 0; i < driven.Length; i++)
        {
            PrescribedBenchCase c = driven[i];
            Assert.Equal(BenchGroup.GeneratedRollingPulsesDriven, c.Group);
            DriveSlip law = c.Spec.Pickup.Slip!;
            Assert.InRange(law.PerMps2, 1.4 / (30 * g0), 2.3 / (15 * g0));
            Assert.Equal(0, law.LaunchPerMps2);
            Assert.Equal(rolling[i].Spec with { Accel = null, Pickup = rolling[i].Spec.Pickup with { SpinUp = null, Slip = law } }, c.Spec);
            Assert.Null(c.AccelCalibration);
            Assert.Equal(rolling[i].AsLog, c.AsLog);
            Assert.Equal(PickupWheel.Driven, c.PickupWheelTold);
            Assert.Null(notTold[plain.Count + i].PickupWheelTold);
            Assert.Equal(law, notTold[plain.Count + i].Spec.Pickup.Slip);
            Assert.Equal(c.Summary.Replace(", told driven", "", StringComparison.Ordinal), notTold[plain.Count + i].Summary);
        }
    }
}
