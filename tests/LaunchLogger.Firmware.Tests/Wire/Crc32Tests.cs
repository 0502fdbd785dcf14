using System.Text;
using LaunchLogger.Firmware.Wire;

namespace LaunchLogger.Firmware.Tests.Wire;

public class Crc32Tests
{
    [Fact]
    public void CatalogueCheckValue()
    {
        // Catalogue of parametrised CRC algorithms, CRC-32/ISO-HDLC: check("123456789") = 0xCBF43926.
        byte[] data = Encoding.ASCII.GetBytes("123456789");
        Assert.Equal(0xCBF43926u, Crc32.Compute(data, 0, data.Length));
    }
}
