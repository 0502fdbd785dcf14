using SkiaSharp;

namespace LaunchLogger.Plots.Tests;

/// <summary>A PNG decoded by SkiaSharp, independent of the code that drew it.</summary>
internal sealed class PngImage
{
    /// <summary>The PNG signature: bytes 137 80 78 71 13 10 26 10 (PNG specification, W3C
    /// Recommendation / ISO/IEC 15948:2004, section 5.2).</summary>
    public static readonly byte[] Signature = [137, 80, 78, 71, 13, 10, 26, 10];

    public PngImage(byte[] bytes)
    {
        Bytes = bytes;
        using SKBitmap bitmap = SKBitmap.Decode(bytes) ?? throw new InvalidDataException("not a decodable image");
        Width = bitmap.Width;
        Height = bitmap.Height;
        Pixels = bitmap.Pixels;
    }

    public byte[] Bytes { get; }

    public int Width { get; }

    public int Height { get; }

    public SKColor[] Pixels { get; }

    public int DistinctColours => Pixels.Distinct().Count();

    /// <summary>Pixels within <paramref name="tolerance"/> of a colour in every channel.</summary>
    public int CountNear(SKColor colour, int tolerance = 8) => Pixels.Count(p =>
        Math.Abs(p.Red - colour.Red) <= tolerance && Math.Abs(p.Green - colour.Green) <= tolerance && Math.Abs(p.Blue - colour.Blue) <= tolerance);
}
