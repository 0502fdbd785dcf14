namespace LaunchLogger.Decoding.Runs;

/// <summary>Which sensor axis, with which sign, is the car's forward, lateral and vertical axis.</summary>
/// <remarks>
/// <para>Forward comes from the configuration. Vertical is the remaining axis that carried the
/// most resting gravity when the box was staged, signed so that it reads +g at rest; without a
/// resting vector it is z, or y when z points forward (a box lying flat, the usual mounting),
/// pointing up. Lateral is the last axis, signed to complete a right-handed frame: lateral =
/// vertical × forward, i.e. positive to the left as in ISO 8855's vehicle axes (x forward,
/// y left, z up). That relies on the sensor's own axes being right-handed, as accelerometers'
/// are.</para>
/// </remarks>
/// <param name="ForwardAxis">Sensor axis along the car (0 = x, 1 = y, 2 = z).</param>
/// <param name="ForwardSign">+1 or −1.</param>
/// <param name="LateralAxis">Sensor axis across the car.</param>
/// <param name="LateralSign">+1 or −1 (positive = left).</param>
/// <param name="VerticalAxis">Sensor axis up the car.</param>
/// <param name="VerticalSign">+1 or −1 (positive = up).</param>
/// <param name="VerticalFromGravity">True when the resting gravity vector chose the vertical axis.</param>
public sealed record AxisMapping(int ForwardAxis, int ForwardSign, int LateralAxis, int LateralSign, int VerticalAxis, int VerticalSign, bool VerticalFromGravity)
{
    /// <summary>Chooses the mapping.</summary>
    /// <param name="forwardAxis">The configured forward axis (0 = x, 1 = y, 2 = z).</param>
    /// <param name="forwardReversed">True when that axis points backward.</param>
    /// <param name="restMilliG">The resting gravity vector in sensor axes, when known.</param>
    /// <exception cref="ArgumentOutOfRangeException"><paramref name="forwardAxis"/> is not 0, 1 or 2.</exception>
    public static AxisMapping Choose(int forwardAxis, bool forwardReversed, (double X, double Y, double Z)? restMilliG)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(forwardAxis, 0);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(forwardAxis, 2);
        int forwardSign = forwardReversed ? -1 : 1;

        // The two axes left, higher-numbered first: the default vertical comes first.
        int first = forwardAxis == 2 ? 1 : 2;
        int second = 3 - forwardAxis - first;
        int vertical = first;
        int verticalSign = 1;
        bool fromGravity = false;
        if (restMilliG is { } rest)
        {
            double[] g = [rest.X, rest.Y, rest.Z];
            int pick = Math.Abs(g[second]) > Math.Abs(g[first]) ? second : first;
            if (g[pick] != 0)
            {
                vertical = pick;
                verticalSign = g[pick] > 0 ? 1 : -1;
                fromGravity = true;
            }
        }

        int lateral = 3 - forwardAxis - vertical;
        int lateralSign = verticalSign * forwardSign * LeviCivita(vertical, forwardAxis, lateral);
        return new AxisMapping(forwardAxis, forwardSign, lateral, lateralSign, vertical, verticalSign, fromGravity);
    }

    /// <summary>The sign of the permutation (a, b, c) of (0, 1, 2): e_a × e_b = ε·e_c.</summary>
    private static int LeviCivita(int a, int b, int c) => (a, b, c) is (0, 1, 2) or (1, 2, 0) or (2, 0, 1) ? 1 : -1;
}
