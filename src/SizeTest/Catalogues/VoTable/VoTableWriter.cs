using System.Globalization;
using System.Text;
using System.Xml;
using SizeTest.Foundation.Files;

namespace SizeTest.Catalogues.VoTable;

/// <summary>
/// Writes a <see cref="CatalogueTable"/> as a VOTable 1.4 document (IVOA Recommendation 2019) in
/// the TABLEDATA serialisation: one RESOURCE, one TABLE, a FIELD per column with datatype
/// (<c>double</c>, <c>long</c>, <c>char</c> with <c>arraysize="*"</c>), unit, ucd and DESCRIPTION;
/// nulls as empty TD. Written atomically.
/// </summary>
public static class VoTableWriter
{
    /// <summary>Writes <paramref name="table"/> to <paramref name="path"/> (replacing it; callers check <c>--force</c>).</summary>
    /// <param name="path">Target file.</param>
    /// <param name="table">The table.</param>
    /// <param name="description">Text for the RESOURCE DESCRIPTION (e.g. "synthetic demo catalogue"), or null.</param>
    public static void Write(string path, CatalogueTable table, string? description = null)
    {
        ArgumentNullException.ThrowIfNull(table);
        AtomicFile.Write(path, stream =>
        {
            var settings = new XmlWriterSettings { Encoding = new UTF8Encoding(false), Indent = true, IndentChars = " " };
            using var w = XmlWriter.Create(stream, settings);
            w.WriteStartDocument();
            w.WriteStartElement("VOTABLE", "http://www.ivoa.net/xml/VOTable/v1.3");
            w.WriteAttributeString("version", "1.4");
            w.WriteStartElement("RESOURCE");
            if (description is not null) w.WriteElementString("DESCRIPTION", description);
            w.WriteStartElement("TABLE");
            if (table.Name is not null) w.WriteAttributeString("name", table.Name);
            foreach (var c in table.Columns)
            {
                w.WriteStartElement("FIELD");
                w.WriteAttributeString("name", c.Name);
                w.WriteAttributeString("datatype", c.Reals is not null ? "double" : c.Integers is not null ? "long" : "char");
                if (c.Texts is not null) w.WriteAttributeString("arraysize", "*");
                if (!string.IsNullOrEmpty(c.Unit)) w.WriteAttributeString("unit", c.Unit);
                if (!string.IsNullOrEmpty(c.Ucd)) w.WriteAttributeString("ucd", c.Ucd);
                if (!string.IsNullOrEmpty(c.Description)) w.WriteElementString("DESCRIPTION", c.Description);
                w.WriteEndElement();
            }
            w.WriteStartElement("DATA");
            w.WriteStartElement("TABLEDATA");
            for (int r = 0; r < table.RowCount; r++)
            {
                w.WriteStartElement("TR");
                foreach (var c in table.Columns)
                {
                    string text = c.Reals is { } re ? (double.IsNaN(re[r]) ? "" : re[r].ToString("R", CultureInfo.InvariantCulture))
                        : c.Integers is { } ie ? ie[r].ToString(CultureInfo.InvariantCulture)
                        : c.Texts![r] ?? "";
                    w.WriteElementString("TD", text);
                }
                w.WriteEndElement();
            }
            w.WriteEndElement();
            w.WriteEndElement();
            w.WriteEndElement();
            w.WriteEndElement();
            w.WriteEndElement();
            w.WriteEndDocument();
        });
    }
}
