using System.Reflection;
using LaunchLogger.Decoding.Calibration;
using LaunchLogger.Decoding.Runs;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Decoding.Tests.Calibration;

public class CalibrationApplierTests
{
    private static DecodedRun Run() => CalibrationRuns.Launch((0.2, 0, 9.8), seed: 3);

    [Fact]
    public void TheCircumferenceReplacesTheConfiguredOneAndTheDistancePerPulse()
    {
        DecodedRun run = Run();

        DecodedRun applied = CalibrationApplier.Apply(run, new CalibrationSettings { CircumferenceM = 1.92 });

        Assert.Equal(1.92, applied.Configuration.CircumferenceM);
        Assert.Equal(1.92 / 48, applied.Configuration.MetresPerPulse, 15);
        Assert.Equal(48, applied.Configuration.PulsesPerRevolution);
        Assert.Contains(applied.Warnings, w => w.Contains("1.92000 m", StringComparison.Ordinal) && w.Contains("1.96000 m", StringComparison.Ordinal));

        // A pure transformation: the input is as it was.
        Assert.Equal(1.96, run.Configuration.CircumferenceM);
        Assert.Empty(run.Warnings);
    }

    [Fact]
    public void AStaticCircumferenceReplacesTheConfiguredOneAndSaysItIsTakenAsStatic()
    {
        DecodedRun run = Run();

        DecodedRun applied = CalibrationApplier.Apply(run, new CalibrationSettings { StaticCircumferenceM = 1.99 });

        Assert.Equal(1.99, applied.Configuration.CircumferenceM);
        Assert.Equal(1.99 / 48, applied.Configuration.MetresPerPulse, 15);
        string note = Assert.Single(applied.Warnings);
        Assert.Contains("static circumference 1.99000 m", note, StringComparison.Ordinal);
        Assert.Contains("roll on 1 % less", note, StringComparison.Ordinal);
    }

    [Fact]
    public void ARolledCircumferenceWinsOverAStaticOne()
    {
        DecodedRun applied = CalibrationApplier.Apply(Run(), new CalibrationSettings { CircumferenceM = 1.92, StaticCircumferenceM = 1.99 });

        Assert.Equal(1.92, applied.Configuration.CircumferenceM);
        Assert.DoesNotContain(applied.Warnings, w => w.Contains("static", StringComparison.Ordinal));
    }

    [Fact]
    public void EverythingElseIsCarriedOverUnchanged()
    {
        // Every property holds something other than its default, so that a copy which drops
        // one (the lost-frame count once was) cannot pass by default equalling default.
        DecodedRun launch = Run();
        DecodedRun run = launch with
        {
            SecondPulses = launch.Pulses,
            Events = [new RunEvent(EventKind.Motion, 2.0, [])],
            RestGravityMilliG = (20, 0, 1000),
            FirmwareMotionS = 2.001,
            FirmwareRolloutS = 2.45,
            Health = new Dictionary<string, long> { ["clock_wraps"] = 1 },
            FramesLost = 3,
            Complete = true,
            Warnings = ["1 CRC error"],
        };
        foreach (PropertyInfo property in typeof(DecodedRun).GetProperties().Where(p => p.GetIndexParameters().Length == 0 && p.Name != "EqualityContract"))
        {
            object? value = property.GetValue(run);
            object? fallback = property.PropertyType.IsValueType ? Activator.CreateInstance(property.PropertyType) : null;
            Assert.False(Equals(value, fallback) || value is System.Collections.IEnumerable { } e && value is not string && !e.Cast<object>().Any(), $"give {property.Name} a value in this test");
        }

        DecodedRun applied = CalibrationApplier.Apply(run, new CalibrationSettings { CircumferenceM = 1.92 });

        // Every property, including any added to DecodedRun later, must be copied.
        foreach (PropertyInfo property in typeof(DecodedRun).GetProperties())
        {
            if (property.Name is nameof(DecodedRun.Configuration) or nameof(DecodedRun.Warnings))
            {
                continue;
            }

            Assert.True(Equals(property.GetValue(run), property.GetValue(applied)), $"{property.Name} was not carried over");
        }
    }

    [Fact]
    public void SettingsWithNothingForRunsLeaveTheRunAsItIs()
    {
        DecodedRun run = Run();

        DecodedRun applied = CalibrationApplier.Apply(run, new CalibrationSettings { MountingPitchDeg = 1.2, MountingYawDeg = 0.5, Notes = "red car" });

        Assert.Same(run, applied);
    }

    [Fact]
    public void AToothMapIsLeftToTheReconstructionAndAnotherPickupsIsNoted()
    {
        DecodedRun run = Run();
        double[] map = Enumerable.Range(0, 48).Select(k => k % 2 == 0 ? 1.01 : 0.99).ToArray();

        DecodedRun applied = CalibrationApplier.Apply(run, new CalibrationSettings { ToothSpacing = map });
        DecodedRun wrongPickup = CalibrationApplier.Apply(run, new CalibrationSettings { ToothSpacing = map[..12] });

        // The reconstruction turns the map to the run and says whether it could (ToothMapTurnTests).
        Assert.Same(run, applied);
        Assert.Same(run.Pulses, wrongPickup.Pulses);
        Assert.Equal(run.Configuration, wrongPickup.Configuration);
        Assert.Contains(wrongPickup.Warnings, w => w.Contains("12 entries", StringComparison.Ordinal) && w.Contains("not applied", StringComparison.Ordinal));
    }

    [Fact]
    public void APlainTextInputWithoutPulsesPerRevolutionKeepsItsDistancePerPulse()
    {
        DecodedRun run = Run();
        var text = new DecodedRun
        {
            Source = "edges.csv",
            Configuration = run.Configuration with { PulsesPerRevolution = 0, CircumferenceM = 0, MetresPerPulse = 0.04 },
            Pulses = run.Pulses,
        };

        DecodedRun applied = CalibrationApplier.Apply(text, new CalibrationSettings { CircumferenceM = 1.92 });

        Assert.Equal(0.04, applied.Configuration.MetresPerPulse);
        Assert.Contains(applied.Warnings, w => w.Contains("--pulses-per-rev", StringComparison.Ordinal));
    }
}
