using System.Xml.Linq;

namespace LaunchLogger.Plots.Tests;

/// <summary>An SVG chart parsed as XML, with what the tests ask of it.</summary>
internal sealed class SvgDocument
{
    /// <summary>The SVG namespace (W3C SVG 1.1, section 5.1.1: http://www.w3.org/2000/svg).</summary>
    public static readonly XNamespace Svg = "http://www.w3.org/2000/svg";

    public SvgDocument(string text)
    {
        // Parsing is the first check: XDocument throws on anything that is not well-formed XML.
        Document = XDocument.Parse(text);
    }

    public XDocument Document { get; }

    public XElement Root => Document.Root!;

    /// <summary>Every piece of text drawn, as written.</summary>
    public IReadOnlyList<string> Texts => Document.Descendants(Svg + "text").Select(t => t.Value.Trim()).ToList();

    /// <summary>Every id defined in the document.</summary>
    public ISet<string> Ids => Document.Descendants().Select(e => (string?)e.Attribute("id")).OfType<string>().ToHashSet();

    /// <summary>Every attribute value anywhere.</summary>
    public IEnumerable<XAttribute> Attributes => Document.Descendants().SelectMany(e => e.Attributes());
}
