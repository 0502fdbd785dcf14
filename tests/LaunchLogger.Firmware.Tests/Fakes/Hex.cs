namespace LaunchLogger.Firmware.Tests.Fakes;

/// <summary>Hex strings for readable byte expectations: "11 22 00 33".</summary>
public static class Hex
{
    public static byte[] Parse(string hex) => Convert.FromHexString(hex.Replace(" ", string.Empty));

    public static string Format(byte[] bytes) => Convert.ToHexString(bytes);

    public static string Format(byte[] bytes, int offset, int count) => Convert.ToHexString(bytes, offset, count);

    /// <summary>The bytes first..last inclusive, counting up.</summary>
    public static byte[] Run(int first, int last) => Enumerable.Range(first, last - first + 1).Select(i => (byte)i).ToArray();
}
