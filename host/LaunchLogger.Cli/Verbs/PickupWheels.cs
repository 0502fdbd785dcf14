using LaunchLogger.Decoding.Reconstruction;

namespace LaunchLogger.Cli.Verbs;

/// <summary>The words <c>--pickup-wheel</c> takes, as the settings file spells them
/// (<c>pickup_wheel</c>).</summary>
internal static class PickupWheels
{
    /// <summary>The pickup is on a driven wheel.</summary>
    public const string Driven = "driven";

    /// <summary>The pickup is on an undriven wheel.</summary>
    public const string Undriven = "undriven";

    /// <summary>The pickup is on a wheel of a car whose four wheels are all driven.</summary>
    public const string DrivenAllWheels = "driven_all_wheels";

    /// <summary>The wheel a word names; null for none.</summary>
    public static PickupWheel? Parse(string? word) => word switch
    {
        null => null,
        Driven => PickupWheel.Driven,
        Undriven => PickupWheel.Undriven,
        DrivenAllWheels => PickupWheel.DrivenAllWheels,
        _ => throw new ArgumentOutOfRangeException(nameof(word), word, "not a pickup wheel"),
    };
}
