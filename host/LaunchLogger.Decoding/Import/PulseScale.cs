using LaunchLogger.Decoding.Runs;
using static System.FormattableString;

namespace LaunchLogger.Decoding.Import;

/// <summary>Distance per pulse for plain-text pulse inputs, from <c>--metres-per-pulse</c> or from
/// <c>--pulses-per-rev</c> with <c>--circumference-m</c>.</summary>
/// <param name="MetresPerPulse">Distance per pulse, metres.</param>
/// <param name="PulsesPerRevolution">Pulses per wheel revolution, 0 when not given.</param>
/// <param name="CircumferenceM">Rolling circumference, metres, 0 when not given.</param>
public sealed record PulseScale(double MetresPerPulse, int PulsesPerRevolution, double CircumferenceM)
{
    /// <summary>Option name for the distance per pulse.</summary>
    public const string MetresPerPulseOption = "--metres-per-pulse";

    /// <summary>Option name for the pulses per revolution.</summary>
    public const string PulsesPerRevOption = "--pulses-per-rev";

    /// <summary>Option name for the rolling circumference.</summary>
    public const string CircumferenceOption = "--circumference-m";

    /// <summary>Builds the scale from whichever options were given.</summary>
    /// <returns>The scale, or null when none of the options was given.</returns>
    /// <exception cref="InputException">The options do not fit together or are out of range
    /// (the exception's <see cref="InputException.File"/> names the option).</exception>
    public static PulseScale? FromOptions(double? metresPerPulse, int? pulsesPerRevolution, double? circumferenceM)
    {
        bool wheel = pulsesPerRevolution.HasValue || circumferenceM.HasValue;
        if (metresPerPulse is { } m)
        {
            if (wheel)
            {
                throw new InputException(MetresPerPulseOption, 0, $"give it or {PulsesPerRevOption} with {CircumferenceOption}, not both");
            }

            if (InputLimits.CheckMetresPerPulse(m) is { } implausible)
            {
                throw new InputException(MetresPerPulseOption, 0, implausible);
            }

            return new PulseScale(m, 0, 0);
        }

        if (!wheel)
        {
            return null;
        }

        if (pulsesPerRevolution is not { } ppr)
        {
            throw new InputException(PulsesPerRevOption, 0, $"is needed with {CircumferenceOption}");
        }

        if (circumferenceM is not { } c)
        {
            throw new InputException(CircumferenceOption, 0, $"is needed with {PulsesPerRevOption}");
        }

        if (InputLimits.CheckPulsesPerRevolution(ppr) is { } badCount)
        {
            throw new InputException(PulsesPerRevOption, 0, badCount);
        }

        if (InputLimits.CheckCircumference(c) is { } badCircumference)
        {
            throw new InputException(CircumferenceOption, 0, badCircumference);
        }

        if (InputLimits.CheckMetresPerPulse(c / ppr) is { } badScale)
        {
            throw new InputException(PulsesPerRevOption, 0, badScale);
        }

        return new PulseScale(c / ppr, ppr, c);
    }
}
