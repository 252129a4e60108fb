/**
 * A scope walker over the ESTree-shaped TypeScript AST from oxc-parser: which names a
 * cell declares at its top level, and which names it uses without declaring them.
 *
 * References are collected with the scope they occur in and resolved after the walk, so
 * hoisting (`var`, function declarations, use before `let`) needs no special pass:
 *
 *     module scope ── const a, function f, var v (from any nested block)
 *       └─ function f ── params, var, arguments
 *            └─ block { } ── let, const, class, function
 *
 * A name used in a type position only (`x: Foo`) is a type reference: it orders nothing
 * at run time, and an unknown one is left to the type checker.
 *
 * @module
 */

/** A loosely typed AST node (the parser's output is plain JSON-like objects). */
// deno-lint-ignore no-explicit-any
export type AstNode = Record<string, any> & { type: string; start: number; end: number };

/** How a top-level name was declared. */
export type DeclarationKind =
  | "const"
  | "let"
  | "var"
  | "using"
  | "function"
  | "class"
  | "import"
  | "type"
  | "interface"
  | "enum"
  | "namespace";

/** A name the cell declares at its top level. */
export interface TopLevelName {
  /** The name. */
  name: string;
  /** Declaration form. */
  kind: DeclarationKind;
  /** Offset of the name in the cell's code (UTF-16 units). */
  start: number;
  /** True for names that exist only for the type checker (`type`, `interface`, `import type`). */
  typeOnly: boolean;
}

/** A use of a name the cell does not declare. */
export interface FreeReference {
  /** The name. */
  name: string;
  /** Offset in the cell's code. */
  start: number;
  /** True when the name is used only as a type. */
  typeOnly: boolean;
  /** True when the name is written (`x = 1`, `x++`, `[x] = pair`). */
  write: boolean;
}

interface Scope {
  parent: Scope | undefined;
  /** Function scopes (and the module) take `var` declarations. */
  isFunction: boolean;
  values: Set<string>;
  types: Set<string>;
}

interface PendingReference {
  name: string;
  start: number;
  scope: Scope;
  typeOnly: boolean;
  write: boolean;
}

/** The walker's result. */
export interface ScopeResult {
  /** Top-level declarations, in source order. */
  declared: TopLevelName[];
  /** Free references, in source order (every occurrence). */
  free: FreeReference[];
}

/**
 * Walks a parsed program and returns its top-level declarations and free references.
 *
 * @param program The `Program` node from oxc-parser.
 * @returns Declarations and free references.
 */
export function walkScopes(program: AstNode): ScopeResult {
  const walker = new Walker();
  walker.program(program);
  return walker.result();
}

const TYPE_KEYS = new Set([
  "typeAnnotation",
  "typeArguments",
  "typeParameters",
  "returnType",
  "superTypeArguments",
  "implements",
]);
const SKIP_KEYS = new Set(["type", "start", "end", "range", "loc", "parent"]);

class Walker {
  readonly module: Scope = newScope(undefined, true);
  scope: Scope = this.module;
  readonly declared: TopLevelName[] = [];
  readonly pending: PendingReference[] = [];

  result(): ScopeResult {
    const free: FreeReference[] = [];
    for (const ref of this.pending) {
      let found = false;
      for (let scope: Scope | undefined = ref.scope; scope; scope = scope.parent) {
        if (scope.values.has(ref.name) || (ref.typeOnly && scope.types.has(ref.name))) {
          found = true;
          break;
        }
      }
      if (!found) {
        free.push({ name: ref.name, start: ref.start, typeOnly: ref.typeOnly, write: ref.write });
      }
    }
    return { declared: this.declared, free };
  }

  // ── scopes and declarations ────────────────────────────────────────────────────────

  enter(isFunction: boolean): Scope {
    this.scope = newScope(this.scope, isFunction);
    return this.scope;
  }

  leave(scope: Scope): void {
    this.scope = scope.parent!;
  }

  /** True while walking a `declare …` statement: its names have no run-time value. */
  ambient = false;

  declare(id: AstNode, kind: DeclarationKind, target: Scope = this.scope): void {
    const typeOnly = kind === "type" || kind === "interface" || this.ambient;
    if (typeOnly) target.types.add(id.name);
    else target.values.add(id.name);
    if (kind === "class" || kind === "enum") target.types.add(id.name);
    if (target === this.module) {
      this.declared.push({ name: id.name, kind, start: id.start, typeOnly });
    }
  }

  functionScope(): Scope {
    let scope = this.scope;
    while (!scope.isFunction) scope = scope.parent!;
    return scope;
  }

  reference(id: AstNode, typeOnly = false, write = false): void {
    this.pending.push({ name: id.name, start: id.start, scope: this.scope, typeOnly, write });
  }

  // ── statements ────────────────────────────────────────────────────────────────────

  program(node: AstNode): void {
    for (const statement of node.body) this.statement(statement);
  }

  statements(list: AstNode[]): void {
    for (const statement of list) this.statement(statement);
  }

  statement(node: AstNode | null | undefined): void {
    if (!node) return;
    if (node.declare === true || node.type === "TSDeclareFunction") {
      const outer = this.ambient;
      this.ambient = true;
      try {
        return this.statementBody(node);
      } finally {
        this.ambient = outer;
      }
    }
    return this.statementBody(node);
  }

  statementBody(node: AstNode): void {
    switch (node.type) {
      case "VariableDeclaration":
        return this.variableDeclaration(node);
      case "FunctionDeclaration":
      case "TSDeclareFunction":
        if (node.id) this.declare(node.id, "function");
        return this.functionLike(node);
      case "ClassDeclaration":
        if (node.id) this.declare(node.id, "class");
        return this.classLike(node);
      case "ImportDeclaration":
        for (const specifier of node.specifiers ?? []) {
          const typeOnly = node.importKind === "type" || specifier.importKind === "type";
          this.declare(specifier.local, typeOnly ? "type" : "import");
        }
        return this.attributes(node);
      case "ExportNamedDeclaration":
      case "ExportDefaultDeclaration":
        if (node.declaration) {
          const declaration = node.declaration;
          if (/Declaration$/.test(declaration.type)) this.statement(declaration);
          else this.expression(declaration);
        }
        for (const specifier of node.specifiers ?? []) {
          if (!node.source && specifier.local?.type === "Identifier") {
            this.reference(specifier.local);
          }
        }
        return;
      case "ExportAllDeclaration":
        return;
      case "TSTypeAliasDeclaration": {
        this.declare(node.id, "type");
        const scope = this.enter(false);
        this.typeParameters(node.typeParameters);
        this.type(node.typeAnnotation);
        return this.leave(scope);
      }
      case "TSInterfaceDeclaration": {
        this.declare(node.id, "interface");
        const scope = this.enter(false);
        this.typeParameters(node.typeParameters);
        for (const heritage of node.extends ?? []) this.type(heritage);
        this.type(node.body);
        return this.leave(scope);
      }
      case "TSEnumDeclaration": {
        this.declare(node.id, "enum");
        const scope = this.enter(false);
        const members = node.body?.members ?? node.members ?? [];
        for (const member of members) {
          if (member.id?.type === "Identifier") scope.values.add(member.id.name);
        }
        for (const member of members) this.expression(member.initializer);
        return this.leave(scope);
      }
      case "TSModuleDeclaration": {
        if (node.id?.type === "Identifier") this.declare(node.id, "namespace");
        const scope = this.enter(true);
        if (node.body?.type === "TSModuleBlock") this.statements(node.body.body);
        else this.statement(node.body);
        return this.leave(scope);
      }
      case "TSImportEqualsDeclaration":
        this.declare(node.id, node.importKind === "type" ? "type" : "import");
        if (node.moduleReference?.type !== "TSExternalModuleReference") {
          this.reference(leftmost(node.moduleReference));
        }
        return;
      case "TSExportAssignment":
      case "TSNamespaceExportDeclaration":
        return this.expression(node.expression);
      case "ExpressionStatement":
        return this.expression(node.expression);
      case "BlockStatement":
      case "StaticBlock": {
        const scope = this.enter(node.type === "StaticBlock");
        this.statements(node.body);
        return this.leave(scope);
      }
      case "IfStatement":
        this.expression(node.test);
        this.statement(node.consequent);
        return this.statement(node.alternate);
      case "ForStatement": {
        const scope = this.enter(false);
        if (node.init?.type === "VariableDeclaration") this.statement(node.init);
        else this.expression(node.init);
        this.expression(node.test);
        this.expression(node.update);
        this.statement(node.body);
        return this.leave(scope);
      }
      case "ForInStatement":
      case "ForOfStatement": {
        const scope = this.enter(false);
        if (node.left.type === "VariableDeclaration") this.statement(node.left);
        else this.pattern(node.left, undefined);
        this.expression(node.right);
        this.statement(node.body);
        return this.leave(scope);
      }
      case "WhileStatement":
      case "DoWhileStatement":
        this.expression(node.test);
        return this.statement(node.body);
      case "ReturnStatement":
      case "ThrowStatement":
        return this.expression(node.argument);
      case "SwitchStatement": {
        this.expression(node.discriminant);
        const scope = this.enter(false);
        for (const branch of node.cases) {
          this.expression(branch.test);
          this.statements(branch.consequent);
        }
        return this.leave(scope);
      }
      case "TryStatement":
        this.statement(node.block);
        if (node.handler) {
          const scope = this.enter(false);
          if (node.handler.param) this.pattern(node.handler.param, "let");
          this.statement(node.handler.body);
          this.leave(scope);
        }
        return this.statement(node.finalizer);
      case "LabeledStatement":
        // The label is not a variable.
        return this.statement(node.body);
      case "BreakStatement":
      case "ContinueStatement":
      case "EmptyStatement":
      case "DebuggerStatement":
        return;
      case "WithStatement":
        this.expression(node.object);
        return this.statement(node.body);
      default:
        return this.expression(node);
    }
  }

  variableDeclaration(node: AstNode): void {
    const kind: DeclarationKind = node.kind === "var"
      ? "var"
      : node.kind === "let"
      ? "let"
      : node.kind === "const"
      ? "const"
      : "using";
    for (const declarator of node.declarations) {
      this.pattern(declarator.id, kind);
      this.expression(declarator.init);
    }
  }

  attributes(node: AstNode): void {
    for (const attribute of node.attributes ?? []) this.expression(attribute.value);
  }

  // ── patterns: declarations (kind given) or assignment targets (kind undefined) ───────

  pattern(node: AstNode | null | undefined, kind: DeclarationKind | undefined): void {
    if (!node) return;
    switch (node.type) {
      case "Identifier":
        if (kind === undefined) this.reference(node, false, true);
        else this.declare(node, kind, kind === "var" ? this.functionScope() : this.scope);
        return this.type(node.typeAnnotation);
      case "ObjectPattern":
        for (const property of node.properties) {
          if (property.type === "RestElement") this.pattern(property.argument, kind);
          else {
            if (property.computed) this.expression(property.key);
            this.pattern(property.value, kind);
          }
        }
        return this.type(node.typeAnnotation);
      case "ArrayPattern":
        for (const element of node.elements) this.pattern(element, kind);
        return this.type(node.typeAnnotation);
      case "AssignmentPattern":
        this.pattern(node.left, kind);
        return this.expression(node.right);
      case "RestElement":
        this.pattern(node.argument, kind);
        return this.type(node.typeAnnotation);
      case "TSParameterProperty":
        for (const decorator of node.decorators ?? []) this.expression(decorator);
        return this.pattern(node.parameter, kind);
      case "TSNonNullExpression":
      case "TSAsExpression":
      case "TSSatisfiesExpression":
      case "TSTypeAssertion":
      case "ParenthesizedExpression":
        this.pattern(node.expression, kind);
        return this.type(node.typeAnnotation);
      default:
        // Member expressions and the like: ordinary expressions that are written through.
        return this.expression(node);
    }
  }

  // ── functions and classes ─────────────────────────────────────────────────────────

  functionLike(node: AstNode, ownName?: AstNode): void {
    for (const decorator of node.decorators ?? []) this.expression(decorator);
    const scope = this.enter(true);
    if (ownName) this.declare(ownName, "const");
    // `arguments` exists in every non-arrow function.
    if (node.type !== "ArrowFunctionExpression") scope.values.add("arguments");
    this.typeParameters(node.typeParameters);
    for (const param of node.params ?? []) {
      for (const decorator of param.decorators ?? []) this.expression(decorator);
      this.pattern(param, "let");
    }
    this.type(node.returnType);
    const body = node.body;
    if (body?.type === "BlockStatement" || body?.type === "FunctionBody") {
      // Parameters and the body's top level share a scope for our purposes.
      this.statements(body.body ?? body.statements ?? []);
    } else if (body) {
      this.expression(body);
    }
    this.leave(scope);
  }

  classLike(node: AstNode, ownName?: AstNode): void {
    for (const decorator of node.decorators ?? []) this.expression(decorator);
    this.expression(node.superClass);
    const scope = this.enter(false);
    if (ownName) this.declare(ownName, "class");
    this.typeParameters(node.typeParameters);
    this.type(node.superTypeArguments);
    for (const heritage of node.implements ?? []) this.type(heritage);
    for (const member of node.body?.body ?? []) this.classMember(member);
    this.leave(scope);
  }

  classMember(member: AstNode): void {
    for (const decorator of member.decorators ?? []) this.expression(decorator);
    switch (member.type) {
      case "MethodDefinition":
      case "TSAbstractMethodDefinition":
        if (member.computed) this.expression(member.key);
        return this.expression(member.value);
      case "PropertyDefinition":
      case "AccessorProperty":
      case "TSAbstractPropertyDefinition":
      case "TSAbstractAccessorProperty": {
        if (member.computed) this.expression(member.key);
        this.type(member.typeAnnotation);
        const scope = this.enter(true);
        this.expression(member.value);
        return this.leave(scope);
      }
      case "StaticBlock":
        return this.statement(member);
      case "TSIndexSignature":
        return this.type(member);
      default:
        return this.expression(member);
    }
  }

  // ── expressions ───────────────────────────────────────────────────────────────────

  expression(node: AstNode | null | undefined): void {
    if (!node || typeof node !== "object") return;
    switch (node.type) {
      case "Identifier":
        return this.reference(node);
      case "Literal":
      case "ThisExpression":
      case "Super":
      case "MetaProperty":
      case "PrivateIdentifier":
      case "TemplateElement":
        return;
      case "MemberExpression":
        this.expression(node.object);
        if (node.computed) this.expression(node.property);
        return;
      case "ObjectExpression":
        for (const property of node.properties) {
          if (property.type === "SpreadElement") this.expression(property.argument);
          else {
            if (property.computed) this.expression(property.key);
            this.expression(property.value);
          }
        }
        return;
      case "FunctionExpression":
        return this.functionLike(node, node.id ?? undefined);
      case "ArrowFunctionExpression":
        return this.functionLike(node);
      case "ClassExpression":
        return this.classLike(node, node.id ?? undefined);
      case "FunctionDeclaration":
      case "ClassDeclaration":
        return this.statement(node);
      case "AssignmentExpression":
        if (node.left.type === "Identifier") {
          // `x += 1` reads x as well as writing it.
          if (node.operator !== "=") this.reference(node.left);
          this.reference(node.left, false, true);
        } else this.pattern(node.left, undefined);
        return this.expression(node.right);
      case "UpdateExpression":
        if (node.argument.type === "Identifier") {
          this.reference(node.argument);
          this.reference(node.argument, false, true);
        } else this.expression(node.argument);
        return;
      case "TSAsExpression":
      case "TSSatisfiesExpression":
      case "TSTypeAssertion":
        this.expression(node.expression);
        return this.type(node.typeAnnotation);
      case "TSInstantiationExpression":
        this.expression(node.expression);
        return this.type(node.typeArguments);
      case "ImportExpression":
        this.expression(node.source);
        return this.expression(node.options);
      default:
        return this.children(node);
    }
  }

  /** Fallback: walk every child node, types in type mode, the rest as expressions. */
  children(node: AstNode): void {
    for (const key in node) {
      if (SKIP_KEYS.has(key)) continue;
      const value = node[key];
      if (value === null || typeof value !== "object") continue;
      const walk = TYPE_KEYS.has(key)
        ? (child: AstNode) => this.type(child)
        : (child: AstNode) => this.expression(child);
      if (Array.isArray(value)) {
        for (const child of value) if (child && typeof child.type === "string") walk(child);
      } else if (typeof value.type === "string") walk(value);
    }
  }

  // ── types ─────────────────────────────────────────────────────────────────────────

  typeParameters(node: AstNode | null | undefined): void {
    if (!node) return;
    for (const parameter of node.params ?? []) {
      this.scope.types.add(parameter.name?.name ?? parameter.name);
    }
    for (const parameter of node.params ?? []) {
      this.type(parameter.constraint);
      this.type(parameter.default);
    }
  }

  type(node: AstNode | null | undefined): void {
    if (!node || typeof node !== "object") return;
    if (Array.isArray(node)) {
      for (const child of node) this.type(child);
      return;
    }
    switch (node.type) {
      case "TSTypeReference":
        this.reference(leftmost(node.typeName), true);
        return this.type(node.typeArguments);
      case "TSTypeQuery":
        if (node.exprName?.type !== "TSImportType") this.reference(leftmost(node.exprName), true);
        return this.type(node.typeArguments);
      case "TSExpressionWithTypeArguments":
      case "TSInterfaceHeritage":
      case "TSClassImplements":
        this.reference(leftmost(node.expression), true);
        return this.type(node.typeArguments);
      case "TSImportType":
        return;
      case "TSMappedType": {
        const scope = this.enter(false);
        const key = node.key ?? node.typeParameter?.name;
        if (key) scope.types.add(key.name ?? key);
        this.type(node.constraint ?? node.typeParameter?.constraint);
        this.type(node.nameType);
        this.type(node.typeAnnotation);
        return this.leave(scope);
      }
      case "TSInferType":
        this.scope.types.add(node.typeParameter.name?.name ?? node.typeParameter.name);
        return;
      case "TSFunctionType":
      case "TSConstructorType":
      case "TSCallSignatureDeclaration":
      case "TSConstructSignatureDeclaration":
      case "TSMethodSignature": {
        const scope = this.enter(false);
        this.typeParameters(node.typeParameters);
        if (node.computed) this.type(node.key);
        for (const param of node.params ?? []) this.type(param.typeAnnotation ?? param);
        this.type(node.returnType);
        return this.leave(scope);
      }
      case "TSPropertySignature":
        if (node.computed) this.computedTypeKey(node.key);
        return this.type(node.typeAnnotation);
      case "TSTypePredicate":
        return this.type(node.typeAnnotation);
      case "Identifier":
        // Parameter names inside function types: not references.
        return this.type(node.typeAnnotation);
      case "TSTypeAnnotation":
        return this.type(node.typeAnnotation);
      case "TSEnumMember":
      case "Literal":
      case "TSLiteralType":
        return;
      default:
        for (const key in node) {
          if (SKIP_KEYS.has(key) || key === "key") continue;
          const value = node[key];
          if (value === null || typeof value !== "object") continue;
          if (Array.isArray(value)) {
            for (const child of value) {
              if (child && typeof child.type === "string") this.type(child);
            }
          } else if (typeof value.type === "string") this.type(value);
        }
    }
  }

  /** `[Symbol.iterator]: T` inside a type: the key's names are used, as types only. */
  computedTypeKey(node: AstNode): void {
    const id = leftmost(node);
    if (id?.type === "Identifier") this.reference(id, true);
  }
}

function newScope(parent: Scope | undefined, isFunction: boolean): Scope {
  return { parent, isFunction, values: new Set(), types: new Set() };
}

/** The first identifier of `a.b.c` (member expressions and qualified type names). */
function leftmost(node: AstNode): AstNode {
  let current = node;
  while (current) {
    if (current.type === "TSQualifiedName") current = current.left;
    else if (current.type === "MemberExpression") current = current.object;
    else break;
  }
  return current;
}
