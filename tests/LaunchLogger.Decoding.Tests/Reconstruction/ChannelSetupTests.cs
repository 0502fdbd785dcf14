using LaunchLogger.Decoding.Reconstruction;
using LaunchLogger.Decoding.Runs;

namespace LaunchLogger.Decoding.Tests.Reconstruction;

/// <summary>The channel stage on pulses written straight into a run: two wheels of known
/// circumference, one of them slipping under drive by a known ratio, as exact edges
/// (<see cref="WindowScene"/>), and brackets of known widths.</summary>
public class ChannelSetupTests
{
    private const double MetresPerPulse = 0.05;

    private static readonly ReconstructionOptions Options = new() { MeasureToothPositions = false };

    /// <summary>3 m/s² for 8 s (to 24 m/s), then a steady 24 m/s to 10 s.</summary>
    private static WindowScene Pull(Func<double, double, double>? wheel) => new()
    {
        CarAccelMps2 = t => t < 0 ? 0 : t < 8 ? 3 : 0,
        WheelSpeedMps = wheel,
        EndS = 10,
        MetresPerPulse = MetresPerPulse,
    };

    [Theory]
    [InlineData(0.01)]
    [InlineData(0.03)]
    [InlineData(0.08)]
    public void TheDistanceRatioOfAnUndrivenToADrivenWheelIsOneOverOnePlusTheSlip(double slip)
    {
        PulseChannel driven = Pull((_, v) => v * (1 + slip)).Pulses();
        PulseChannel undriven = Pull(null).Pulses();

        double? ratio = ChannelSetup.DistanceUnderDrive(driven, MetresPerPulse, undriven, MetresPerPulse);

        // Longitudinal slip under drive s = (ω·r − v) / v (SAE J670, vehicle dynamics
        // terminology; from memory): the driven wheel's surface covers (1 + s) times the road, the
        // undriven wheel the road itself, so their ratio is 1 / (1 + s) over any stretch.
        Assert.NotNull(ratio);
        Assert.Equal(1 / (1 + slip), ratio.Value, 4);
    }

    [Fact]
    public void TwoWheelsOfDifferentCircumferenceRollingTogetherCoverTheSameDistance()
    {
        // A 48-tooth ring on a 1.92-m tyre and a 40-tooth ring on a 2.00-m tyre: 0.04 m and
        // 0.05 m a pulse; counts times distance per pulse is the road for both.
        PulseChannel a = (Pull(null) with { MetresPerPulse = 0.04 }).Pulses();
        PulseChannel b = Pull(null).Pulses();

        Assert.Equal(1, ChannelSetup.DistanceUnderDrive(a, 0.04, b, MetresPerPulse)!.Value, 4);
    }

    [Fact]
    public void TheSecondChannelCarriesDistanceWhenTheFirstWheelIsDriven()
    {
        DistanceChannel chosen = ChannelSetup.Choose(TwoChannelRun(firstSlip: 0.03, secondSlip: 0), Options);

        Assert.Equal(1, chosen.Index);
        Assert.Equal(MetresPerPulse, chosen.MetresPerPulse);
        Assert.NotNull(chosen.ChoiceNote);
        Assert.Equal(Pull(null).Pulses().Counts, chosen.Pulses!.Counts);
        Assert.Empty(chosen.Warnings);
    }

    [Theory]
    [InlineData(0, 0)]
    [InlineData(0, 0.03)]
    public void TheFirstChannelStaysWhenItIsNotTheOneThatSlips(double firstSlip, double secondSlip)
    {
        DistanceChannel chosen = ChannelSetup.Choose(TwoChannelRun(firstSlip, secondSlip), Options);

        Assert.Equal(0, chosen.Index);
        Assert.Null(chosen.ChoiceNote);
    }

    [Fact]
    public void WithoutFirstPulsesTheSecondChannelCarriesDistance()
    {
        DecodedRun run = TwoChannelRun(0, 0) with { Pulses = [] };

        DistanceChannel chosen = ChannelSetup.Choose(run, Options);

        Assert.Equal(1, chosen.Index);
        Assert.NotNull(chosen.Pulses);
        Assert.Null(chosen.ChoiceNote);
    }

    [Fact]
    public void WithoutPulsesThereIsNoChannel()
    {
        DecodedRun run = TwoChannelRun(0, 0) with { Pulses = [], SecondPulses = [] };

        DistanceChannel chosen = ChannelSetup.Choose(run, Options);

        Assert.Null(chosen.Pulses);
        Assert.Equal(0, chosen.StartNoiseM);
        Assert.Empty(chosen.Warnings);
    }

    [Theory]
    [InlineData(0, true)]
    [InlineData(3, false)]
    public void WideBracketsAreNotedForPlainTextInputsOnly(int formatVersion, bool noted)
    {
        // 100 brackets: 97 of 1 ms and 3 of 3 ms, against the 2-ms limit the configuration gives.
        var records = new List<PulseRecord>();
        for (int k = 1; k <= 100; k++)
        {
            double width = k % 33 == 0 ? 0.003 : 0.001;
            records.Add(new PulseRecord(k, (0.01 * k) - width, 0.01 * k));
        }

        var run = new DecodedRun
        {
            Source = "brackets",
            Configuration = new RunConfiguration { FormatVersion = formatVersion, MetresPerPulse = MetresPerPulse, BracketLimitS = 0.002 },
            Pulses = records,
        };

        DistanceChannel chosen = ChannelSetup.Choose(run, Options);

        if (noted)
        {
            string note = Assert.Single(chosen.Warnings);
            Assert.StartsWith("3 of 100 pulse observations have brackets wider than", note);
        }
        else
        {
            Assert.Empty(chosen.Warnings);
        }
    }

    [Fact]
    public void TheStartNoiseIsTheToothSpacingAlongsideTheFirstBracketsAtTheirSpeed()
    {
        // A steady 10 m/s, one pulse every 5 ms, each bracket 2 ms wide: the tooth spacing σ
        // (1 % of 0.05 m) and a uniform placement over 2 ms at 10 m/s, σ = 0.02 m / √12 (variance
        // of a uniform distribution w²/12; any probability text). Independent, so in quadrature.
        var records = new List<PulseRecord>();
        for (int k = 1; k <= 20; k++)
        {
            double t = 0.005 * k;
            records.Add(new PulseRecord(k, t - 0.001, t + 0.001));
        }

        var run = new DecodedRun
        {
            Source = "steady",
            Configuration = new RunConfiguration { FormatVersion = 3, MetresPerPulse = MetresPerPulse },
            Pulses = records,
        };

        DistanceChannel chosen = ChannelSetup.Choose(run, Options);

        double tooth = 0.01 * MetresPerPulse;
        double placement = 10 * 0.002 / Math.Sqrt(12);
        Assert.Equal(Math.Sqrt((tooth * tooth) + (placement * placement)), chosen.StartNoiseM, 9);
    }

    /// <summary>A staged run with both wheels logged through <see cref="Pull"/>, each wheel's
    /// surface turning (1 + slip) times the car's speed.</summary>
    private static DecodedRun TwoChannelRun(double firstSlip, double secondSlip) => new()
    {
        Source = "two wheels",
        Configuration = new RunConfiguration
        {
            FormatVersion = 3,
            Staged = true,
            MetresPerPulse = MetresPerPulse,
            PulsesPerRevolution = 40,
            HasSecondChannel = true,
            SecondMetresPerPulse = MetresPerPulse,
            SecondPulsesPerRevolution = 40,
        },
        Pulses = Pull((_, v) => v * (1 + firstSlip)).PulseRecords(),
        SecondPulses = Pull((_, v) => v * (1 + secondSlip)).PulseRecords(),
    };
}
