#include "geometry/msh_check.h"

#include "case/input_error.h"

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <map>
#include <set>
#include <sstream>
#include <unordered_set>
#include <vector>

namespace fickcast
{
  namespace
  {
    /// Nodes per element for the Gmsh element types (Gmsh reference manual, "MSH file format",
    /// element types 1-17 and 92-93; from memory).
    int nodes_of_type(const long type)
    {
      static const std::map<long, int> nodes{{1, 2},  {2, 3},  {3, 4},   {4, 4},   {5, 8},   {6, 6},   {7, 5},
                                             {8, 3},  {9, 6},  {10, 9},  {11, 10}, {12, 27}, {13, 18}, {14, 14},
                                             {15, 1}, {16, 8}, {17, 20}, {92, 64}, {93, 125}};
      const auto found = nodes.find(type);
      return found == nodes.end() ? -1 : found->second;
    }

    constexpr long most = 200000000; // counts beyond this are damage, not meshes

    /// Whitespace-separated tokens with the line each came from.
    class Tokens
    {
    public:
      explicit Tokens(const std::string &path)
        : path_(path)
      {
        std::ifstream in(path);
        if (!in)
          throw InputError(path, "geometry.mesh", "cannot open the mesh file");
        std::string line;
        std::size_t number = 0;
        while (std::getline(in, line))
          {
            ++number;
            std::istringstream words(line);
            std::string word;
            while (words >> word)
              tokens_.push_back({word, number});
          }
      }

      bool done() const { return next_ >= tokens_.size(); }
      /// The line of the token read last.
      std::size_t line() const { return next_ == 0 ? 1 : tokens_[std::min(next_, tokens_.size()) - 1].line; }

      [[noreturn]] void fail(const std::string &expected, const std::string &found) const
      {
        const std::size_t line = next_ == 0 ? 1 : tokens_[std::min(next_, tokens_.size()) - 1].line;
        throw InputError(path_ + ":" + std::to_string(line), "geometry.mesh",
                         "expected " + expected + ", found " + found + " (the mesh file is damaged or not Gmsh ASCII)");
      }

      const std::string &word(const std::string &expected)
      {
        if (done())
          fail(expected, "the end of the file");
        return tokens_[next_++].text;
      }

      long integer(const std::string &expected, const long low = 0, const long high = most)
      {
        const std::string &w = word(expected);
        char *end = nullptr;
        const long v = std::strtol(w.c_str(), &end, 10);
        if (end == w.c_str() || *end != '\0')
          fail(expected, "'" + w + "'");
        if (v < low || v > high)
          fail(expected + " (between " + std::to_string(low) + " and " + std::to_string(high) + ")", "'" + w + "'");
        return v;
      }

      double real(const std::string &expected)
      {
        const std::string &w = word(expected);
        char *end = nullptr;
        const double v = std::strtod(w.c_str(), &end);
        if (end == w.c_str() || *end != '\0' || !std::isfinite(v))
          fail(expected, "'" + w + "'");
        return v;
      }

      void expect(const std::string &keyword)
      {
        const std::string &w = word(keyword);
        if (w != keyword)
          fail(keyword, "'" + w + "'");
      }

      /// Skips to just past @p keyword.
      void skip_to(const std::string &keyword)
      {
        while (!done())
          if (tokens_[next_++].text == keyword)
            return;
        fail(keyword, "the end of the file");
      }

      /// Skips a quoted name that may contain spaces.
      void quoted(const std::string &expected)
      {
        std::string w = word(expected);
        if (w.empty() || w.front() != '"')
          fail(expected, "'" + w + "'");
        while (w.size() < 2 || w.back() != '"')
          w = word(expected + " (closing quote)");
      }

    private:
      struct Token
      {
        std::string text;
        std::size_t line;
      };
      std::string path_;
      std::vector<Token> tokens_;
      std::size_t next_ = 0;
    };

    void physical_names(Tokens &t)
    {
      const long n = t.integer("the number of physical names");
      for (long i = 0; i < n; ++i)
        {
          t.integer("a physical group's dimension", 0, 3);
          t.integer("a physical tag", 1);
          t.quoted("a quoted physical name");
        }
      t.expect("$EndPhysicalNames");
    }

    void nodes_22(Tokens &t, std::unordered_set<long> &tags)
    {
      const long n = t.integer("the number of nodes", 1);
      for (long i = 0; i < n; ++i)
        {
          const long tag = t.integer("a node tag", 1);
          if (!tags.insert(tag).second)
            t.fail("a node tag not used before", "node " + std::to_string(tag) + " again");
          for (int c = 0; c < 3; ++c)
            t.real("a node coordinate");
        }
      t.expect("$EndNodes");
    }

    /// The dimension of a Gmsh element type (the same list as nodes_of_type).
    int dimension_of_type(const long type)
    {
      static const std::map<long, int> dimension{{1, 1},  {2, 2},  {3, 2},  {4, 3},  {5, 3},  {6, 3},  {7, 3},
                                                 {8, 1},  {9, 2},  {10, 2}, {11, 3}, {12, 3}, {13, 3}, {14, 3},
                                                 {15, 0}, {16, 2}, {17, 3}, {92, 3}, {93, 3}};
      const auto found = dimension.find(type);
      return found == dimension.end() ? -1 : found->second;
    }

    void elements_22(Tokens &t, const std::unordered_set<long> &nodes, std::vector<MshElement> &elements)
    {
      const long n = t.integer("the number of elements", 1);
      for (long i = 0; i < n; ++i)
        {
          const long tag = t.integer("an element tag", 1);
          const std::size_t line = t.line();
          const long type = t.integer("an element type", 1, 200);
          const int count = nodes_of_type(type);
          if (count < 0)
            t.fail("a Gmsh element type", "type " + std::to_string(type));
          elements.push_back({tag, dimension_of_type(type), line});
          const long n_tags = t.integer("the number of element tags", 0, 100);
          for (long k = 0; k < n_tags; ++k)
            t.integer("an element tag value", -most);
          for (int k = 0; k < count; ++k)
            {
              const long node = t.integer("a node of the element", 1);
              if (nodes.count(node) == 0)
                t.fail("a node defined in $Nodes", "node " + std::to_string(node));
            }
        }
      t.expect("$EndElements");
    }

    using EntitySet = std::set<std::pair<long, long>>; // (dimension, tag)

    void entities_41(Tokens &t, EntitySet &entities)
    {
      long count[4];
      for (long &c : count)
        c = t.integer("a number of entities");
      for (int dim = 0; dim < 4; ++dim)
        for (long i = 0; i < count[dim]; ++i)
          {
            const long tag = t.integer("an entity tag", 1);
            entities.insert({dim, tag});
            for (int c = 0; c < (dim == 0 ? 3 : 6); ++c)
              t.real("an entity's coordinate");
            const long n_physical = t.integer("the number of physical tags", 0, 1000);
            for (long k = 0; k < n_physical; ++k)
              t.integer("a physical tag", -most);
            if (dim > 0)
              {
                const long n_bounding = t.integer("the number of bounding entities", 0, 100000);
                for (long k = 0; k < n_bounding; ++k)
                  t.integer("a bounding entity", -most);
              }
          }
      t.expect("$EndEntities");
    }

    void nodes_41(Tokens &t, const EntitySet &entities, std::unordered_set<long> &tags)
    {
      const long blocks = t.integer("the number of node blocks");
      const long total = t.integer("the number of nodes", 1);
      t.integer("the smallest node tag");
      t.integer("the largest node tag");
      long seen = 0;
      for (long b = 0; b < blocks; ++b)
        {
          const long dim = t.integer("a node block's entity dimension", 0, 3);
          const long entity = t.integer("a node block's entity tag", 1);
          if (!entities.empty() && entities.count({dim, entity}) == 0)
            t.fail("an entity of $Entities",
                   "entity " + std::to_string(entity) + " of dimension " + std::to_string(dim));
          const long parametric = t.integer("0 or 1 (parametric)", 0, 1);
          const long n = t.integer("the number of nodes in the block", 0, total - seen);
          for (long i = 0; i < n; ++i)
            {
              const long tag = t.integer("a node tag", 1);
              if (!tags.insert(tag).second)
                t.fail("a node tag not used before", "node " + std::to_string(tag) + " again");
            }
          for (long i = 0; i < n; ++i)
            for (long c = 0; c < 3 + (parametric ? dim : 0); ++c)
              t.real("a node coordinate");
          seen += n;
        }
      if (seen != total)
        t.fail(std::to_string(total) + " nodes as the header says", std::to_string(seen));
      t.expect("$EndNodes");
    }

    void elements_41(Tokens &t, const EntitySet &entities, const std::unordered_set<long> &nodes,
                     std::vector<MshElement> &elements)
    {
      const long blocks = t.integer("the number of element blocks");
      const long total = t.integer("the number of elements", 1);
      t.integer("the smallest element tag");
      t.integer("the largest element tag");
      long seen = 0;
      for (long b = 0; b < blocks; ++b)
        {
          const long dim = t.integer("an element block's entity dimension", 0, 3);
          const long entity = t.integer("an element block's entity tag", 1);
          if (!entities.empty() && entities.count({dim, entity}) == 0)
            t.fail("an entity of $Entities",
                   "entity " + std::to_string(entity) + " of dimension " + std::to_string(dim));
          const long type = t.integer("an element type", 1, 200);
          const int count = nodes_of_type(type);
          if (count < 0)
            t.fail("a Gmsh element type", "type " + std::to_string(type));
          const long n = t.integer("the number of elements in the block", 0, total - seen);
          for (long i = 0; i < n; ++i)
            {
              const long tag = t.integer("an element tag", 1);
              elements.push_back({tag, static_cast<int>(dim), t.line()});
              for (int k = 0; k < count; ++k)
                {
                  const long node = t.integer("a node of the element", 1);
                  if (nodes.count(node) == 0)
                    t.fail("a node defined in $Nodes", "node " + std::to_string(node));
                }
            }
          seen += n;
        }
      if (seen != total)
        t.fail(std::to_string(total) + " elements as the header says", std::to_string(seen));
      t.expect("$EndElements");
    }
  } // namespace

  std::vector<MshElement> check_msh_structure(const std::string &path)
  {
    std::vector<MshElement> elements;
    Tokens t(path);
    t.expect("$MeshFormat");
    const std::string version = t.word("a format version");
    if (version != "2.2" && version != "4.1" && version != "4")
      t.fail("format 2.2 or 4.1", "'" + version + "'");
    t.integer("0 (ASCII; save the mesh from Gmsh without the binary option)", 0, 0);
    t.integer("the size of a double", 8, 8);
    t.expect("$EndMeshFormat");
    const bool v4 = version != "2.2";
    EntitySet entities;
    std::unordered_set<long> nodes;
    bool have_nodes = false, have_elements = false;
    while (!t.done())
      {
        const std::string section = t.word("a section");
        if (section == "$PhysicalNames")
          physical_names(t);
        else if (section == "$Entities" && v4)
          entities_41(t, entities);
        else if (section == "$Nodes")
          {
            if (v4)
              nodes_41(t, entities, nodes);
            else
              nodes_22(t, nodes);
            have_nodes = true;
          }
        else if (section == "$Elements")
          {
            if (!have_nodes)
              t.fail("$Nodes before $Elements", "$Elements");
            if (v4)
              elements_41(t, entities, nodes, elements);
            else
              elements_22(t, nodes, elements);
            have_elements = true;
          }
        else if (section.size() > 1 && section[0] == '$' && section.rfind("$End", 0) != 0)
          t.skip_to("$End" + section.substr(1));
        else
          t.fail("a section such as $Nodes or $Elements", "'" + section + "'");
      }
    if (!have_nodes || !have_elements)
      t.fail("$Nodes and $Elements sections", std::string(have_nodes ? "no $Elements" : "no $Nodes"));
    return elements;
  }
} // namespace fickcast
