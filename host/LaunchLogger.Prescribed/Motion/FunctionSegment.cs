using MathNet.Numerics.Integration;

namespace LaunchLogger.Prescribed.Motion;

/// <summary>Any smooth acceleration history given as a function of the time since the piece
/// began, integrated numerically with error control.</summary>
/// <remarks>Adaptive Gauss–Kronrod quadrature (15-point Kronrod extension of the 7-point Gauss
/// rule; Piessens et al., QUADPACK, 1983) to a relative error of 1e-13, as MathNet.Numerics
/// implements it. Slower than the closed forms: use it where no closed form exists.</remarks>
public sealed class FunctionSegment : AccelSegment
{
    private const double TargetRelativeError = 1e-13;
    private const int MaximumDepth = 20;
    private const int KronrodOrder = 15;
    private readonly Func<double, double> accel;
    private readonly string description;

    /// <summary>Creates the piece.</summary>
    /// <param name="durationS">How long it lasts.</param>
    /// <param name="accelMps2">a(τ), m/s², for τ in [0, duration]; smooth.</param>
    /// <param name="description">A few words for listings.</param>
    public FunctionSegment(double durationS, Func<double, double> accelMps2, string description)
        : base(durationS)
    {
        accel = accelMps2 ?? throw new ArgumentNullException(nameof(accelMps2));
        this.description = description;
    }

    /// <inheritdoc/>
    public override double AccelMps2(double tauS) => accel(tauS);

    /// <inheritdoc/>
    public override double SpeedGainMps(double tauS) => tauS <= 0 ? 0 : Integrate(accel, tauS);

    /// <inheritdoc/>
    public override double DistanceGainM(double tauS) => tauS <= 0 ? 0 : Integrate(s => (tauS - s) * accel(s), tauS);

    /// <inheritdoc/>
    public override string Describe() => description;

    private static double Integrate(Func<double, double> f, double upper) =>
        GaussKronrodRule.Integrate(f, 0, upper, out _, out _, TargetRelativeError, MaximumDepth, KronrodOrder);
}
