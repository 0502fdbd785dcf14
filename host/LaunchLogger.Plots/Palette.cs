using ScottPlot;

namespace LaunchLogger.Plots;

/// <summary>Our colours: a warm paper ground, ink-dark text, one hue per quantity, and marks that
/// stand apart from every trace.</summary>
internal static class Palette
{
    public static readonly Color Paper = Color.FromHex("#FBFAF6");
    public static readonly Color DataArea = Color.FromHex("#FFFFFF");
    public static readonly Color Ink = Color.FromHex("#22262B");
    public static readonly Color Grid = Color.FromHex("#E6E2D8");

    public static readonly Color Speed = Color.FromHex("#136F63");
    public static readonly Color Distance = Color.FromHex("#8C4A1F");
    public static readonly Color Accel = Color.FromHex("#4B3F8F");
    public static readonly Color Theirs = Color.FromHex("#C2571A");
    public static readonly Color Difference = Color.FromHex("#5A6470");

    public static readonly Color FirstMotion = Color.FromHex("#39424C");
    public static readonly Color Rollout = Color.FromHex("#B8860B");
    public static readonly Color RolloutZone = Color.FromHex("#E9C46A").WithAlpha(70);
    public static readonly Color BrakeOnset = Color.FromHex("#A4243B");
    public static readonly Color Zero = Color.FromHex("#9AA3AD");

    /// <summary>Band fill for a trace's colour (its ±σ).</summary>
    public static Color Band(Color trace) => trace.WithAlpha(55);

    /// <summary>Colours for overlaid runs, in order, repeating.</summary>
    public static readonly Color[] Runs =
    [
        Color.FromHex("#136F63"),
        Color.FromHex("#C2571A"),
        Color.FromHex("#4B3F8F"),
        Color.FromHex("#7A8B1E"),
        Color.FromHex("#B0306A"),
        Color.FromHex("#2F6DB5"),
        Color.FromHex("#8C4A1F"),
        Color.FromHex("#3A3F45"),
    ];
}
