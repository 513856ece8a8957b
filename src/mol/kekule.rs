//! Kekulization of aromatic (lower-case) input: every aromatic atom that
//! needs a pi bond (see `build`) must get exactly one double bond to an
//! aromatic neighbour through a ring bond written aromatic. That is a
//! perfect matching on those atoms; it is found greedily (forced choices
//! first) and completed with Edmonds' blossom augmenting paths, so fused
//! odd rings (azulene) are handled. An atom left unmatched is reported.

/// Candidate partners in compressed rows: partners of vertex `i` are
/// `list[start[i]..start[i + 1]]` as (vertex, bond).
pub(crate) struct Graph {
    pub start: Vec<usize>,
    pub list: Vec<(usize, usize)>,
}

impl std::ops::Index<usize> for Graph {
    type Output = [(usize, usize)];
    fn index(&self, i: usize) -> &[(usize, usize)] {
        &self.list[self.start[i]..self.start[i + 1]]
    }
}

impl Graph {
    fn len(&self) -> usize {
        self.start.len().saturating_sub(1)
    }
}

/// Returns the partner of each vertex (usize::MAX when unmatched).
pub(crate) fn perfect_matching(adj: &Graph) -> Vec<usize> {
    const NONE: usize = usize::MAX;
    let n = adj.len();
    let mut mate = vec![NONE; n];
    // Greedy: match vertices with one free neighbour first (forced
    // choices), otherwise the next free vertex with its first free neighbour.
    let mut free_deg: Vec<usize> = (0..n).map(|v| adj[v].len()).collect();
    let mut forced: Vec<usize> = (0..n).filter(|&v| free_deg[v] == 1).collect();
    let mut next_any = 0;
    loop {
        let v = match forced.pop() {
            Some(v) => v,
            None => {
                while next_any < n && (mate[next_any] != NONE || free_deg[next_any] == 0) {
                    next_any += 1;
                }
                if next_any == n {
                    break;
                }
                next_any
            }
        };
        if mate[v] != NONE {
            continue;
        }
        let Some(&(w, _)) = adj[v].iter().find(|(w, _)| mate[*w] == NONE) else {
            continue;
        };
        mate[v] = w;
        mate[w] = v;
        for &u in &[v, w] {
            for &(x, _) in adj[u].iter() {
                if mate[x] == NONE {
                    free_deg[x] = free_deg[x].saturating_sub(1);
                    if free_deg[x] == 1 {
                        forced.push(x);
                    }
                }
            }
        }
    }
    if mate.iter().all(|m| *m != NONE) {
        return mate;
    }
    // Edmonds' blossom algorithm for the remaining free vertices.
    let mut blossom = Blossom {
        adj,
        mate,
        parent: vec![NONE; n],
        base: (0..n).collect(),
        used: vec![false; n],
        in_blossom: vec![false; n],
        queue: Vec::new(),
    };
    for root in 0..n {
        if blossom.mate[root] == NONE {
            if let Some(end) = blossom.find_path(root) {
                blossom.augment(end);
            }
        }
    }
    blossom.mate
}

struct Blossom<'a> {
    adj: &'a Graph,
    mate: Vec<usize>,
    parent: Vec<usize>,
    base: Vec<usize>,
    used: Vec<bool>,
    in_blossom: Vec<bool>,
    queue: Vec<usize>,
}

const NONE: usize = usize::MAX;

impl Blossom<'_> {
    fn lca(&self, mut a: usize, mut b: usize) -> usize {
        let mut seen = vec![false; self.mate.len()];
        loop {
            a = self.base[a];
            seen[a] = true;
            if self.mate[a] == NONE {
                break;
            }
            a = self.parent[self.mate[a]];
        }
        loop {
            b = self.base[b];
            if seen[b] {
                return b;
            }
            b = self.parent[self.mate[b]];
        }
    }

    fn mark_path(&mut self, mut v: usize, b: usize, mut child: usize) {
        while self.base[v] != b {
            self.in_blossom[self.base[v]] = true;
            self.in_blossom[self.base[self.mate[v]]] = true;
            self.parent[v] = child;
            child = self.mate[v];
            v = self.parent[self.mate[v]];
        }
    }

    fn find_path(&mut self, root: usize) -> Option<usize> {
        let n = self.mate.len();
        self.used.iter_mut().for_each(|u| *u = false);
        self.parent.iter_mut().for_each(|p| *p = NONE);
        for (i, b) in self.base.iter_mut().enumerate() {
            *b = i;
        }
        self.used[root] = true;
        self.queue.clear();
        self.queue.push(root);
        let mut head = 0;
        while head < self.queue.len() {
            let v = self.queue[head];
            head += 1;
            for k in 0..self.adj[v].len() {
                let to = self.adj[v][k].0;
                if self.base[v] == self.base[to] || self.mate[v] == to {
                    continue;
                }
                if to == root || (self.mate[to] != NONE && self.parent[self.mate[to]] != NONE) {
                    let cur = self.lca(v, to);
                    self.in_blossom.iter_mut().for_each(|x| *x = false);
                    self.mark_path(v, cur, to);
                    self.mark_path(to, cur, v);
                    for i in 0..n {
                        if self.in_blossom[self.base[i]] {
                            self.base[i] = cur;
                            if !self.used[i] {
                                self.used[i] = true;
                                self.queue.push(i);
                            }
                        }
                    }
                } else if self.parent[to] == NONE {
                    self.parent[to] = v;
                    if self.mate[to] == NONE {
                        return Some(to);
                    }
                    let next = self.mate[to];
                    self.used[next] = true;
                    self.queue.push(next);
                }
            }
        }
        None
    }

    fn augment(&mut self, mut v: usize) {
        while v != NONE {
            let pv = self.parent[v];
            let ppv = self.mate[pv];
            self.mate[v] = pv;
            self.mate[pv] = v;
            v = ppv;
        }
    }
}
