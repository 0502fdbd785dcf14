using System.Reflection;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Tests.Fakes;

namespace LaunchLogger.Firmware.Tests.Run;

public class LoggerSettingsTests
{
    public static TheoryData<string, int> BadValues => new()
    {
        { "PulsesPerRevolution", 0 },
        { "PulsesPerRevolution", 10001 },
        { "CircumferenceMicrometres", 99999 },
        { "CircumferenceMicrometres", 10000001 },
        { "SecondPulsesPerRevolution", 0 },
        { "SecondCircumferenceMicrometres", -1 },
        { "RolloutMicrometres", -1 },
        { "RolloutMicrometres", 10000001 },
        { "AccelOutputDataRateMilliHz", 999 },
        { "AccelFullScaleMilliG", 999 },
        { "AccelFullScaleMilliG", 400001 },
        { "ForwardAxis", -1 },
        { "ForwardAxis", 3 },
        { "PreTriggerSamples", 0 },
        { "PreTriggerBursts", 0 },
        { "StageHoldMicros", 999 },
        { "StillBandMilliG", 0 },
        { "StillBlockMicros", 999 },
        { "StillBlockMicros", 500001 },
        { "MotionThresholdMilliG", 0 },
        { "MotionThresholdMilliG", 4001 },
        { "MotionConfirmSamples", 0 },
        { "MotionConfirmSamples", 1001 },
        { "StopHoldMicros", 9999 },
        { "BracketLimitMicros", 0 },
        { "UnstagedOpenMicrometres", -1 },
        { "PulseFrameMaxAgeMicros", 999 },
        { "HealthIntervalMicros", 9999 },
    };

    [Theory]
    [MemberData(nameof(BadValues))]
    public void EachBadValueGivesAMessageNamingTheSettingAndItsValue(string setting, int value)
    {
        LoggerSettings settings = WithSecondChannel();
        Set(settings, setting, value);

        string? problem = settings.Validate();
        Assert.NotNull(problem);
        Assert.StartsWith(setting + " ", problem);
        Assert.Contains("(was " + value + ")", problem);
    }

    [Theory]
    [MemberData(nameof(BadValues))]
    public void TheRecorderRefusesBadSettingsWithThatMessage(string setting, int value)
    {
        LoggerSettings settings = WithSecondChannel();
        Set(settings, setting, value);
        var ex = Assert.Throws<ArgumentException>(() => new RunRecorder(settings, new MemorySink(), null!));
        Assert.Equal(settings.Validate(), ex.Message);
    }

    [Theory]
    [InlineData(1_000_000, 16, 50)]   // 1 kHz: a 50-ms still block is the longer
    [InlineData(200_000, 16, 16)]     // 200 Hz: the block holds 10, the confirm window 16
    public void APreTriggerRingShorterThanTheOnsetWindowIsRefused(int rateMilliHz, int confirm, int window)
    {
        var settings = new LoggerSettings { AccelOutputDataRateMilliHz = rateMilliHz, PreTriggerSamples = window - 1, MotionConfirmSamples = confirm };
        string? problem = settings.Validate();
        Assert.NotNull(problem);
        Assert.Contains("PreTriggerSamples (" + (window - 1) + ")", problem);
        Assert.Contains("onset window's " + window + " samples", problem);
        Assert.Equal(problem, Assert.Throws<ArgumentException>(() => new RunRecorder(settings, new MemorySink(), null!)).Message);
        settings.PreTriggerSamples = window;
        Assert.Null(settings.Validate());
    }

    [Fact]
    public void ARangeMessageGivesTheRangeAndTheValue()
    {
        Assert.Equal("StillBandMilliG must be from 1 to 2000 (was 0)", new LoggerSettings { StillBandMilliG = 0 }.Validate());
    }

    [Fact]
    public void TheDefaultsAreValid()
    {
        Assert.Null(new LoggerSettings().Validate());
        Assert.Null(WithSecondChannel().Validate());
    }

    [Fact]
    public void SettingsOfPartsThatAreNotFittedAreNotChecked()
    {
        var settings = new LoggerSettings
        {
            AccelPresent = false,
            AccelOutputDataRateMilliHz = 0,
            AccelFullScaleMilliG = 0,
            PreTriggerSamples = 0,
            PreTriggerBursts = 0,
            SecondChannelEnabled = false,
            SecondPulsesPerRevolution = 0,
            SecondCircumferenceMicrometres = 0,
        };
        Assert.Null(settings.Validate());
        _ = new RunRecorder(settings, new MemorySink(), null!);
    }

    [Theory]
    [InlineData("PulsesPerRevolution", 1)]
    [InlineData("PulsesPerRevolution", 10000)]
    [InlineData("RolloutMicrometres", 0)]
    [InlineData("ForwardAxis", 2)]
    [InlineData("StageHoldMicros", 1000)]
    [InlineData("StillBlockMicros", 1000)]
    [InlineData("StillBlockMicros", 500000)]
    [InlineData("UnstagedOpenMicrometres", 0)]
    public void TheEndsOfEachRangeAreAccepted(string setting, int value)
    {
        LoggerSettings settings = WithSecondChannel();
        Set(settings, setting, value);
        Assert.Null(settings.Validate());
    }

    [Fact]
    public void ANullSinkOrSettingsIsRejected()
    {
        Assert.Throws<ArgumentNullException>(() => new RunRecorder(null!, new MemorySink(), null!));
        Assert.Throws<ArgumentNullException>(() => new RunRecorder(new LoggerSettings(), null!, null!));
    }

    private static LoggerSettings WithSecondChannel() => new() { SecondChannelEnabled = true };

    private static void Set(LoggerSettings settings, string name, int value)
    {
        PropertyInfo property = typeof(LoggerSettings).GetProperty(name) ?? throw new ArgumentException("no setting " + name);
        property.SetValue(settings, value);
    }
}
