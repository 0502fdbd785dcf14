namespace LaunchLogger.Decoding.CrossCheck;

/// <summary>Latitude and longitude to metres east and north of a reference fix.</summary>
/// <remarks>A local equirectangular projection on a sphere of the IUGG mean Earth radius
/// R1 = 6,371,008.8 m (from memory; the mean radius of the GRS 80 ellipsoid). Over the few
/// kilometres of a strip its error against the ellipsoid is far below a receiver's position noise;
/// it is used only to turn positions into distances and speeds, never to navigate.</remarks>
public static class GeoProjection
{
    /// <summary>Mean Earth radius, m.</summary>
    public const double EarthRadiusM = 6_371_008.8;

    /// <summary>Projects every fix relative to the first.</summary>
    public static (double[] East, double[] North) Project(IReadOnlyList<double> latDeg, IReadOnlyList<double> lonDeg)
    {
        int n = latDeg.Count;
        var east = new double[n];
        var north = new double[n];
        if (n == 0)
        {
            return (east, north);
        }

        double lat0 = latDeg[0] * Math.PI / 180;
        double lon0 = lonDeg[0] * Math.PI / 180;
        double cosLat = Math.Cos(lat0);
        for (int i = 0; i < n; i++)
        {
            east[i] = (lonDeg[i] * Math.PI / 180 - lon0) * cosLat * EarthRadiusM;
            north[i] = (latDeg[i] * Math.PI / 180 - lat0) * EarthRadiusM;
        }

        return (east, north);
    }

    /// <summary>Speeds from positions by central differences (one-sided at the ends), m/s.</summary>
    public static double[] SpeedFromPositions(double[] timeS, double[] east, double[] north)
    {
        int n = timeS.Length;
        var speed = new double[n];
        for (int i = 0; i < n; i++)
        {
            int a = Math.Max(0, i - 1);
            int b = Math.Min(n - 1, i + 1);
            if (b == a)
            {
                continue;
            }

            double dx = east[b] - east[a];
            double dy = north[b] - north[a];
            speed[i] = Math.Sqrt((dx * dx) + (dy * dy)) / (timeS[b] - timeS[a]);
        }

        return speed;
    }
}
