using LaunchLogger.Decoding.CrossCheck;
using LaunchLogger.Simulation.Sensors;

namespace LaunchLogger.Decoding.Tests.CrossCheck;

public sealed class NmeaSentenceTests
{
    // NMEA 0183: the checksum is the exclusive-or of every character between '$' and '*'. The
    // example sentences are those listed in shared/REFERENCES.md (widely circulated examples of
    // the standard's sentence layouts; from memory, each verified by hand against the rule).
    [Theory]
    [InlineData("$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A", "GP", "RMC", 0x6A)]
    [InlineData("$GPVTG,140.88,T,,M,8.04,N,14.89,K,D*05", "GP", "VTG", 0x05)]
    [InlineData("$GPVTG,0.0,T,,M,0.03,N,0.06,K,D*0D", "GP", "VTG", 0x0D)]
    public void Published_example_sentences_verify(string line, string talker, string type, int checksum)
    {
        Assert.True(NmeaSentence.TryParse(line, out NmeaSentence? sentence));
        Assert.Equal(talker, sentence!.Talker);
        Assert.Equal(type, sentence.Type);
        Assert.Equal(checksum, NmeaSentence.Checksum(line.AsSpan(1, line.IndexOf('*') - 1)));

        // The simulator's receiver (which the reader's tests use to write sentences) writes the same line.
        Assert.Equal(line, SatelliteReceiver.Sentence(line[1..line.IndexOf('*')]));
    }

    [Fact]
    public void Rmc_fields_are_numbered_as_the_standard_numbers_them()
    {
        Assert.True(NmeaSentence.TryParse("$GPRMC,123519,A,4807.038,N,01131.000,E,022.4,084.4,230394,003.1,W*6A", out NmeaSentence? s));
        Assert.Equal("123519", s!.Field(1));
        Assert.Equal("A", s.Field(2));
        Assert.Equal("022.4", s.Field(7));
        Assert.Equal("230394", s.Field(9));
        Assert.Equal(string.Empty, s.Field(40));
    }

    [Theory]
    [InlineData("$GPRMC,123519,A,4807.038,N,01131.000,E,022.5,084.4,230394,003.1,W*6A")] // one digit changed
    [InlineData("$GPVTG,140.88,T,,M,8.04,N,14.89,K,D*06")] // checksum off by one
    [InlineData("$GPVTG,140.88,T,,M,8.04,N,14.89,K,D")] // no checksum
    [InlineData("GPVTG,140.88,T,,M,8.04,N,14.89,K,D*05")] // no '$'
    [InlineData("$GPVTG,140.88,T,,M,8.04,N,14.89,K,D*0")] // one hex digit
    public void Damaged_sentences_are_refused(string line)
    {
        Assert.False(NmeaSentence.TryParse(line, out _));
    }
}
